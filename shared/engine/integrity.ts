/**
 * Integrity tests of membrane cartridges: bubble point (Young–Laplace), diffusion
 * (forward flow) and pressure hold / decay, and pass/fail evaluation against the limits a
 * cartridge maker states for a type. Limits are always data, never inferred here.
 */
import { requireFinite, requireNonNegative, requirePositive, requireRange } from './errors';
import { ethanolWaterSurfaceTension, waterSurfaceTension } from './fluids';
import { formatNumber, toUserUnits, type UnitSystem } from './units';

/** Standard atmosphere, bar (NIST SP 811). */
export const STANDARD_ATMOSPHERE_BAR = 1.01325;

/**
 * Shape factor K in ΔP = 4Kσcosθ/d equivalent to the ASTM F316 constant C = 2860
 * (d[µm] = C·σ[mN/m]/p[Pa]): K = C/4000 = 0.715 (ASTM F316-03(2019)).
 */
export const ASTM_F316_SHAPE_FACTOR = 0.715;

/** Inputs of {@link bubblePointBar}. */
export interface BubblePointArgs {
  /** Largest pore diameter, µm (> 0). */
  poreDiameterUm: number;
  /** Surface tension of the wetting liquid, N/m (> 0). */
  surfaceTensionNm: number;
  /** Contact angle of the liquid on the membrane, degrees (0 ≤ θ < 90, default 0 = fully wetting). */
  contactAngleDeg?: number;
  /** Shape/tortuosity factor K (0 < K ≤ 1, default 1 = ideal cylinder; ASTM F316: 0.715). */
  shapeFactor?: number;
}

/**
 * Bubble-point pressure of a liquid-filled pore, bar (gauge): ΔP = 4·K·σ·cosθ/d
 * (Young–Laplace for a cylindrical capillary; ASTM F316-03(2019) uses d = C·σ/p with
 * C = 2860, i.e. K = 0.715).
 *
 * The computed pore size assumes circular capillaries; a "0.2 µm" rating is a retention
 * class (ASTM F838), not a geometric pore size.
 *
 * @returns bubble point, bar (water 20 °C, d = 1 µm, K = 1 → 2.909 bar; K = 0.715 → 2.080 bar)
 */
export function bubblePointBar(args: BubblePointArgs): number {
  const theta = args.contactAngleDeg ?? 0;
  const K = args.shapeFactor ?? 1;
  requirePositive('pore diameter', args.poreDiameterUm);
  requirePositive('surface tension', args.surfaceTensionNm);
  requireRange('contact angle', theta, 0, 89.999, '°');
  requirePositive('shape factor', K);
  requireRange('shape factor', K, 0, 1);
  const pa = (4 * K * args.surfaceTensionNm * Math.cos((theta * Math.PI) / 180)) / (args.poreDiameterUm * 1e-6);
  return pa / 1e5;
}

/**
 * Largest-pore diameter implied by a measured bubble point, µm: d = 4·K·σ·cosθ/ΔP
 * (Young–Laplace; with K = 0.715 this is the ASTM F316 d = 2860·σ[mN/m]/p[Pa]).
 *
 * @param args.bubblePointBar  measured bubble point, bar gauge (> 0)
 * @param args.surfaceTensionNm surface tension of the wetting liquid, N/m (> 0)
 * @param args.contactAngleDeg contact angle, degrees (default 0)
 * @param args.shapeFactor     K (default 1)
 * @returns pore diameter, µm (water 20 °C, 3.5 bar → 0.831 µm; ASTM form 0.594 µm)
 */
export function poreDiameterFromBubblePointUm(args: {
  bubblePointBar: number;
  surfaceTensionNm: number;
  contactAngleDeg?: number;
  shapeFactor?: number;
}): number {
  requirePositive('bubble point', args.bubblePointBar);
  // d·ΔP is constant: evaluate ΔP for 1 µm and scale.
  const at1um = bubblePointBar({
    poreDiameterUm: 1,
    surfaceTensionNm: args.surfaceTensionNm,
    contactAngleDeg: args.contactAngleDeg,
    shapeFactor: args.shapeFactor,
  });
  return at1um / args.bubblePointBar;
}

/** Inputs of {@link expectedBubblePointBar}. */
export interface ExpectedBubblePointArgs {
  /** The type's stated minimum water-wet bubble point, bar gauge (> 0). */
  waterBubblePointBar: number;
  /** Water temperature at which that minimum is stated, °C (0–100, default 20). */
  specTempC?: number;
  /** Test temperature, °C (0–100, default = specTempC). Used when the membrane is water-wet. */
  tempC?: number;
  /**
   * Surface tension of the actual wetting liquid at the test temperature, N/m (> 0), for a
   * product-wet test (e.g. wine ≈ 0.042–0.050). Omit for a water-wet test.
   */
  surfaceTensionNm?: number;
}

/**
 * Expected bubble point when the membrane is wetted with another liquid or tested at
 * another temperature, bar: BP = BP_water,spec × σ_test/σ_water(spec temperature)
 * (Young–Laplace, ΔP ∝ σ at equal pore size and contact angle; water σ from IAPWS
 * R1-76(2014)).
 *
 * Water-wet at 5 °C vs a 20 °C spec: × 1.030. Product-wet with σ ≈ 48 mN/m: × 0.66.
 * Always prefer the maker's own product-wet value where one is given.
 *
 * @returns expected minimum bubble point, bar gauge
 */
export function expectedBubblePointBar(args: ExpectedBubblePointArgs): number {
  const specT = args.specTempC ?? 20;
  const testT = args.tempC ?? specT;
  requirePositive('water bubble point', args.waterBubblePointBar);
  const sigmaSpec = waterSurfaceTension(specT);
  let sigmaTest: number;
  if (args.surfaceTensionNm !== undefined) {
    requirePositive('surface tension of the wetting liquid', args.surfaceTensionNm);
    requireRange('surface tension of the wetting liquid', args.surfaceTensionNm, 0, 0.1, 'N/m');
    sigmaTest = args.surfaceTensionNm;
  } else {
    sigmaTest = waterSurfaceTension(testT);
  }
  return (args.waterBubblePointBar * sigmaTest) / sigmaSpec;
}

/** Inputs of {@link allowedPressureDecayMbar}. */
export interface PressureDecayArgs {
  /** Allowed diffusion flow of the whole housing, mL/min at atmospheric pressure (≥ 0). */
  diffusionLimitMlMin: number;
  /** Test duration, min (> 0). */
  testMin: number;
  /** Gas volume upstream of the membrane (housing + piping after draining), L (> 0). */
  upstreamVolumeL: number;
  /** Atmospheric pressure, bar absolute (0.5–1.1, default 1.01325). */
  atmBar?: number;
}

/**
 * Allowed pressure decay of a pressure-hold test, mbar: ΔP = Q_max·t·p_atm/V_u — the ideal
 * gas law at constant temperature for an isolated upstream volume losing gas by diffusion
 * (PDA Technical Report No. 26, "Sterilizing Filtration of Liquids", 2008).
 * With Q in mL/min, t in min, V_u in L and p_atm in bar: ΔP[mbar] = Q·t·p_atm/V_u.
 *
 * @returns allowed decay, mbar (15 mL/min, 10 min, 5 L, 1.01325 bar → 30.40 mbar)
 */
export function allowedPressureDecayMbar(p: PressureDecayArgs): number {
  const atm = p.atmBar ?? STANDARD_ATMOSPHERE_BAR;
  requireNonNegative('diffusion limit', p.diffusionLimitMlMin);
  requirePositive('test duration', p.testMin);
  requirePositive('upstream volume', p.upstreamVolumeL);
  requireRange('atmospheric pressure', atm, 0.5, 1.1, 'bar');
  // mL → L is ÷1000, bar → mbar is ×1000: they cancel.
  return (p.diffusionLimitMlMin * p.testMin * atm) / p.upstreamVolumeL;
}

/**
 * Diffusion flow equivalent to a measured pressure decay, mL/min at atmospheric pressure:
 * Q = ΔP·V_u/(p_atm·t) — the inverse of {@link allowedPressureDecayMbar} (ideal gas, constant
 * temperature; PDA Technical Report No. 26).
 *
 * @returns equivalent diffusion flow, mL/min
 */
export function equivalentDiffusionMlMin(p: {
  decayMbar: number;
  testMin: number;
  upstreamVolumeL: number;
  atmBar?: number;
}): number {
  const atm = p.atmBar ?? STANDARD_ATMOSPHERE_BAR;
  requireNonNegative('pressure decay', p.decayMbar);
  requirePositive('test duration', p.testMin);
  requirePositive('upstream volume', p.upstreamVolumeL);
  requireRange('atmospheric pressure', atm, 0.5, 1.1, 'bar');
  return (p.decayMbar * p.upstreamVolumeL) / (atm * p.testMin);
}

/**
 * Diffusion limit of a housing, mL/min: per-element limit × number of 10-inch element
 * equivalents (diffusion flow is proportional to membrane area; PDA Technical Report No. 26).
 *
 * @param perElementMlMin    the type's limit per 10-inch element, mL/min (≥ 0)
 * @param elementEquivalents number of 10-inch element equivalents in the housing (whole number ≥ 1)
 * @returns housing limit, mL/min
 */
export function diffusionLimitForHousing(perElementMlMin: number, elementEquivalents: number): number {
  requireNonNegative('diffusion limit per element', perElementMlMin);
  requirePositive('number of element equivalents', elementEquivalents);
  if (!Number.isInteger(elementEquivalents)) {
    throw new RangeError(`Number of element equivalents must be a whole number (got ${String(elementEquivalents)}).`);
  }
  return perElementMlMin * elementEquivalents;
}

/**
 * Change of the upstream gas pressure caused by a temperature drift during a pressure-hold
 * test, mbar: Δp = p_abs·ΔT/T (ideal gas at constant volume). At 2.5 bar gauge and 20 °C a
 * 1 K drift is ≈ 12 mbar — comparable to a typical decay limit.
 *
 * @param gaugeBar test pressure, bar gauge (≥ 0)
 * @param deltaK   temperature change, K (finite; negative for cooling)
 * @param tempC    gas temperature at the start, °C (−20 to 150)
 * @param atmBar   atmospheric pressure, bar (default 1.01325)
 * @returns pressure change, mbar (negative for cooling)
 */
export function thermalPressureChangeMbar(gaugeBar: number, deltaK: number, tempC: number, atmBar = STANDARD_ATMOSPHERE_BAR): number {
  requireNonNegative('test pressure', gaugeBar);
  requireFinite('temperature change', deltaK);
  requireRange('gas temperature', tempC, -20, 150, '°C');
  requireRange('atmospheric pressure', atmBar, 0.5, 1.1, 'bar');
  return (((gaugeBar + atmBar) * deltaK) / (tempC + 273.15)) * 1000;
}

/** Inputs of {@link diffusionFlowMlMin}. */
export interface DiffusionFlowArgs {
  /** Gas diffusivity in the wetting liquid, m²/s (> 0; air in water ≈ 1.9e-9). */
  diffusivityM2S: number;
  /** Henry solubility of the gas in the liquid, mol/(m³·Pa) (> 0; air/water 20 °C ≈ 8.4e-6). */
  henryMolM3Pa: number;
  /** Test pressure, bar gauge (≥ 0). */
  dpBar: number;
  /** Membrane porosity, 0–1. */
  porosity: number;
  /** Membrane area, m² (> 0). */
  areaM2: number;
  /** Membrane thickness, µm (> 0). */
  thicknessUm: number;
  /** Pore tortuosity (≥ 1). */
  tortuosity: number;
  /** Gas temperature, °C (default 20). */
  tempC?: number;
  /** Atmospheric pressure, bar (default 1.01325). */
  atmBar?: number;
}

/**
 * Theoretical diffusion (forward) flow through a wetted membrane, mL/min at atmospheric
 * pressure and test temperature: N = D·H·ΔP·ε·A/(L·τ) (Fick's law with Henry's law; form
 * after Reti, J. Parenter. Drug Assoc. 1977, and PDA Technical Report No. 26);
 * Q = N·R·T/p_atm. For illustration and plausibility only — limits come from the maker.
 *
 * @returns diffusion flow, mL/min
 */
export function diffusionFlowMlMin(a: DiffusionFlowArgs): number {
  const tempC = a.tempC ?? 20;
  const atm = a.atmBar ?? STANDARD_ATMOSPHERE_BAR;
  requirePositive('gas diffusivity', a.diffusivityM2S);
  requirePositive('gas solubility', a.henryMolM3Pa);
  requireNonNegative('test pressure', a.dpBar);
  requireRange('porosity', a.porosity, 0, 1);
  requirePositive('membrane area', a.areaM2);
  requirePositive('membrane thickness', a.thicknessUm);
  requireRange('tortuosity', a.tortuosity, 1, 100);
  requireRange('gas temperature', tempC, -20, 150, '°C');
  requireRange('atmospheric pressure', atm, 0.5, 1.1, 'bar');
  const molPerS =
    (a.diffusivityM2S * a.henryMolM3Pa * a.dpBar * 1e5 * a.porosity * a.areaM2) / (a.thicknessUm * 1e-6 * a.tortuosity);
  const m3PerS = (molPerS * 8.314462618 * (tempC + 273.15)) / (atm * 1e5);
  return m3PerS * 1e6 * 60;
}

// ---------------------------------------------------------------------------
// Pass / fail
// ---------------------------------------------------------------------------

/** A recorded integrity test and the type's limit to judge it by. */
export type IntegrityTestInput =
  | { kind: 'bubble-point'; measuredBar: number; minimumBar: number }
  | { kind: 'diffusion'; measuredMlMin: number; maximumMlMin: number }
  | { kind: 'pressure-hold'; measuredDecayMbar: number; maximumDecayMbar: number };

/** Verdict of {@link evaluateIntegrityTest}. */
export interface IntegrityVerdict {
  pass: boolean;
  /** Plain sentence explaining the verdict, with the reading and the limit. */
  reason: string;
}

/** Formats two numbers with enough decimals (from `minDigits`) that they read differently when they differ. */
function pairText(a: number, b: number, minDigits: number): [string, string] {
  let d = minDigits;
  let sa = formatNumber(a, d);
  let sb = formatNumber(b, d);
  while (a !== b && sa === sb && d < 6) {
    d++;
    sa = formatNumber(a, d);
    sb = formatNumber(b, d);
  }
  return [trimZeros(sa), trimZeros(sb)];
}

function trimZeros(s: string): string {
  return s.includes('.') ? s.replace(/\.?0+$/, '') : s;
}

/**
 * Judges an integrity test against the cartridge type's limit: a bubble point passes when
 * it is at or above the minimum; a diffusion flow or a pressure decay passes when it is at
 * or below the maximum (test methods as in PDA Technical Report No. 26; the limits are the
 * maker's). Readings and limits are in bar, mL/min and mbar; with `system: 'us'` the
 * reason shows pressures in psi.
 *
 * @param test   the reading and its limit
 * @param system unit system for the reason text (default 'metric')
 * @returns { pass, reason }, e.g. "Bubble point 2.9 bar is below the minimum 3.2 bar for this type."
 */
export function evaluateIntegrityTest(test: IntegrityTestInput, system: UnitSystem = 'metric'): IntegrityVerdict {
  switch (test.kind) {
    case 'bubble-point': {
      requireNonNegative('measured bubble point', test.measuredBar);
      requirePositive('minimum bubble point', test.minimumBar);
      const m = toUserUnits('pressure', test.measuredBar, system);
      const l = toUserUnits('pressure', test.minimumBar, system);
      const [sm, sl] = pairText(m.value, l.value, system === 'us' ? 1 : 2);
      const pass = test.measuredBar >= test.minimumBar;
      return {
        pass,
        reason: pass
          ? `Bubble point ${sm} ${m.unit} meets the minimum ${sl} ${l.unit} for this type.`
          : `Bubble point ${sm} ${m.unit} is below the minimum ${sl} ${l.unit} for this type.`,
      };
    }
    case 'diffusion': {
      requireNonNegative('measured diffusion flow', test.measuredMlMin);
      requireNonNegative('maximum diffusion flow', test.maximumMlMin);
      const [sm, sl] = pairText(test.measuredMlMin, test.maximumMlMin, 1);
      const pass = test.measuredMlMin <= test.maximumMlMin;
      return {
        pass,
        reason: pass
          ? `Diffusion flow ${sm} mL/min is within the maximum ${sl} mL/min for this housing.`
          : `Diffusion flow ${sm} mL/min is above the maximum ${sl} mL/min for this housing.`,
      };
    }
    case 'pressure-hold': {
      requireNonNegative('measured pressure decay', test.measuredDecayMbar);
      requireNonNegative('maximum pressure decay', test.maximumDecayMbar);
      const pass = test.measuredDecayMbar <= test.maximumDecayMbar;
      let sm: string;
      let sl: string;
      let unit: string;
      if (system === 'us') {
        const m = toUserUnits('dp', test.measuredDecayMbar / 1000, system);
        const l = toUserUnits('dp', test.maximumDecayMbar / 1000, system);
        [sm, sl] = pairText(m.value, l.value, 2);
        unit = m.unit;
      } else {
        [sm, sl] = pairText(test.measuredDecayMbar, test.maximumDecayMbar, 1);
        unit = 'mbar';
      }
      return {
        pass,
        reason: pass
          ? `Pressure decay ${sm} ${unit} is within the maximum ${sl} ${unit} for this housing.`
          : `Pressure decay ${sm} ${unit} is above the maximum ${sl} ${unit} for this housing.`,
      };
    }
    default: {
      const k = (test as { kind?: unknown }).kind;
      throw new RangeError(`Unknown integrity test kind "${String(k)}".`);
    }
  }
}

/** The liquid a membrane was wetted with for a bubble-point test. */
export type WettingLiquid = { liquid: 'water' } | { liquid: 'wine' | 'ethanol-water'; ethanolPctVol: number };

/**
 * Surface tension of a wetting liquid at the test temperature, N/m: water from IAPWS
 * R1-76(2014); ethanol–water and wine from {@link ethanolWaterSurfaceTension} at the
 * strength given (for wine an upper estimate: real wines sit a few mN/m lower).
 * @param w the wetting liquid; tempC test temperature, °C (0–50 for ethanol–water and wine)
 */
export function wettingSurfaceTension(w: WettingLiquid, tempC: number): number {
  if (w.liquid === 'water') return waterSurfaceTension(tempC);
  return ethanolWaterSurfaceTension(w.ethanolPctVol, tempC);
}

/** Verdict of {@link judgeBubblePoint}. */
export interface BubblePointJudgement extends IntegrityVerdict {
  /** false when the verdict is not final: a product-wet reading below its limit asks for a water re-test */
  final: boolean;
  /** expected minimum for this liquid and temperature, bar gauge */
  minimumBar: number;
}

/**
 * Judges a bubble point read with the membrane wetted by water, wine or an ethanol–water
 * mixture: the type's water-wet minimum scales with the wetting liquid's surface tension
 * (Young–Laplace; {@link expectedBubblePointBar}). A water-wet reading below its minimum is a
 * final fail. A product-wet reading below its minimum is not final: the liquid's surface
 * tension is only estimated and the membrane may be only partly wetted, so the advice is to
 * re-flush with water and re-test (common practice, no source).
 * @param p.measuredBar reading, bar gauge; p.waterMinBar the type's water-wet minimum, bar gauge
 * @param p.specTempC temperature of that minimum (default 20 °C); p.tempC test temperature (default spec)
 * @param p.wetting the liquid (default water)
 */
export function judgeBubblePoint(p: {
  measuredBar: number;
  waterMinBar: number;
  specTempC?: number;
  tempC?: number;
  wetting?: WettingLiquid;
  system?: UnitSystem;
}): BubblePointJudgement {
  const wetting = p.wetting ?? { liquid: 'water' };
  const tempC = p.tempC ?? p.specTempC ?? 20;
  const minimumBar =
    wetting.liquid === 'water'
      ? expectedBubblePointBar({ waterBubblePointBar: p.waterMinBar, specTempC: p.specTempC, tempC })
      : expectedBubblePointBar({ waterBubblePointBar: p.waterMinBar, specTempC: p.specTempC, surfaceTensionNm: wettingSurfaceTension(wetting, tempC) });
  const verdict = evaluateIntegrityTest({ kind: 'bubble-point', measuredBar: p.measuredBar, minimumBar }, p.system);
  if (wetting.liquid === 'water' || verdict.pass) {
    const reason = wetting.liquid === 'water' ? verdict.reason : verdict.reason.replace('for this type.', `for this type wetted with ${wetting.liquid === 'wine' ? 'wine' : 'ethanol–water'} at ${formatNumber(wetting.ethanolPctVol, 1)} % vol.`);
    return { ...verdict, reason, final: true, minimumBar };
  }
  return {
    pass: false,
    final: false,
    minimumBar,
    reason: `${verdict.reason.replace('for this type.', `expected when wetted with ${wetting.liquid === 'wine' ? 'wine' : 'ethanol–water'} at ${formatNumber(wetting.ethanolPctVol, 1)} % vol.`)} Not a final fail: re-flush with water and re-test.`,
  };
}
