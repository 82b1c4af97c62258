import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  CLEAN_DP_MAX_FRACTION_OF_TERMINAL,
  DEFAULT_FLOW_MARGIN_PCT,
  DEFAULT_VMAX_SAFETY_FACTOR,
  capacityFromVmax,
  SANITATION_TEMP_C,
  requiredFlowLh,
  sizeTrain,
  suggestTrain,
  type SizingHousing,
  type SizingStage,
  type SizingWarningCode,
  type TrainSizingInput,
  elementEquivalents,
} from './train-sizing';

// All trains, cartridges and housings below are fictional examples.

const rel = (actual: number, expected: number): number => Math.abs(actual - expected) / Math.abs(expected);

/** Dry 12 %vol wine at 20 °C on a 3,000 bottles/h line; a 1 µm prefilter then a 0.45 µm membrane. */
function baseInput(): TrainSizingInput {
  return {
    wine: { tempC: 20, ethanolPctVol: 12 },
    line: { bottlesPerHour: 3000, bottleMl: 750, marginPct: 10 },
    batchL: 10_000,
    lineLosses: { hoses: [{ diameterMm: 38, lengthM: 20 }], staticHeadBar: 0.2, fillerInletBar: 0.3 },
    stages: [
      {
        name: 'Prefilter 1 µm',
        cartridgeType: {
          kind: 'prefilter', ratingUm: 1, areaM2Per10in: 0.6, waterFlowLhPer10in: 1000, waterDpBar: 0.05,
          maxDpForwardBar: 5, terminalDpBar: 2, designFluxLhPer10in: 1200, capacityLPerM2: 5000,
          pricePer10in: 40, currency: 'EUR',
        },
        housing: { rounds: 3, lengthIn: 20, maxPressureBar: 6, holdUpL: 10 },
      },
      {
        name: 'Membrane 0.45 µm',
        cartridgeType: {
          kind: 'membrane', ratingUm: 0.45, areaM2Per10in: 0.6, waterFlowLhPer10in: 500, waterDpBar: 0.1,
          maxDpForwardBar: 5, terminalDpBar: 1.2, designFluxLhPer10in: 500, capacityLPerM2: 1500,
          regenerable: true, maxRegenerationsPerLot: 2, pricePer10in: 180, currency: 'EUR',
        },
        housing: { rounds: 3, lengthIn: 30, maxPressureBar: 6, holdUpL: 20 },
      },
    ],
  };
}

// ---------------------------------------------------------------------------------------
// Worked scenarios
// ---------------------------------------------------------------------------------------

describe('sizeTrain — single 10-inch module, cold wine (Darcy 1856)', () => {
  // Hand calculation. Clean-water spec: 20 L/min = 1200 L/h at 20 °C, ΔP 100 mbar, one
  // 10-inch module of 0.70 m².
  //   water viscosity at 20 °C: 1.0016 mPa·s (IAPWS R12-08 at 0.101325 MPa)
  //   J = (20e-3/60)/0.70 = 4.7619e-4 m/s; R_m = ΔP/(μ·J) = 1e4/(1.0016e-3 × 4.7619e-4) = 2.0966e10 1/m
  // Wine 12 %vol at 10 °C: μ = 2.141 mPa·s (Bingham & Jackson, Bull. Bur. Standards 14:59
  // (1918) ethanol–water viscosity ratio × IAPWS R12-08 water viscosity; hand calculation;
  // the direct table value is 2.145 mPa·s).
  //   Line: 1600 bottles/h × 0.750 L × (1 + 0) = 1200 L/h, so the wine passes at the spec flow.
  //   Clean ΔP = 0.100 bar × 2.141/1.0016 = 0.2138 bar.
  //   Flux = 1200 L/h per 10-inch module; 1200/0.70 = 1714.29 L m⁻² h⁻¹.
  const input: TrainSizingInput = {
    wine: { tempC: 10, ethanolPctVol: 12 },
    line: { bottlesPerHour: 1600, bottleMl: 750, marginPct: 0 },
    batchL: 2400,
    stages: [
      {
        cartridgeType: {
          kind: 'prefilter', ratingUm: 1, areaM2Per10in: 0.7, waterFlowLhPer10in: 1200, waterDpBar: 0.1,
          maxDpForwardBar: 5, terminalDpBar: 1.5, designFluxLhPer10in: 1500,
        },
        housing: { rounds: 1, lengthIn: 10, maxPressureBar: 6, holdUpL: 1.5 },
      },
    ],
  };
  const r = sizeTrain(input);
  const s = r.stages[0];

  it.each([
    ['flow, L/h (1600 × 0.750 × 1.00; hand calculation)', r.flowLh, 1200, 1e-12],
    ['resistance, 1/m (2.0966e10; hand calculation, Darcy 1856)', s.resistancePerM, 2.0966e10, 2e-4],
    ['wine viscosity, Pa·s (2.141e-3; Bingham & Jackson 1918 × IAPWS R12-08, hand calculation)', r.wineViscosityPaS, 2.141e-3, 1e-2],
    ['clean ΔP, bar (0.2138; hand calculation)', s.cleanDpBar, 0.2138, 1e-2],
    ['flux per 10-inch, L/h (1200/1; hand calculation)', s.fluxLhPer10in, 1200, 1e-12],
    ['flux, L m⁻² h⁻¹ (1200/0.70 = 1714.29; hand calculation)', s.fluxLmh, 1714.2857, 1e-6],
    ['run hours (2400/1200 = 2; hand calculation)', s.runHours, 2, 1e-12],
  ])('%s', (_label, actual, expected, tol) => {
    expect(rel(actual, expected)).toBeLessThan(tol);
  });

  it('ΔP scales exactly with the viscosity ratio at the spec flow (Darcy 1856: ΔP₂ = ΔP₁·μ₂/μ₁)', () => {
    // μ_water(20 °C) = 1.0016 mPa·s (IAPWS R12-08); relation is exact, so 1e-4 relative.
    expect(rel(s.cleanDpBar, (0.1 * r.wineViscosityPaS) / 1.0016e-3)).toBeLessThan(1e-4);
  });

  it('has no capacity, cost or hoses, and reports them as unknown', () => {
    expect(s.capacityL).toBeNull();
    expect(s.loadsNeeded).toBeNull();
    expect(s.interventionKind).toBeNull();
    expect(s.costPerHl).toBeNull();
    expect(r.totals.limitingStageIndex).toBeNull();
    expect(r.totals.lineLossBar).toBe(0);
    expect(r.wineDensityKgM3).toBeNull();
    expect(r.totals.pumpPressureCleanBar).toBeCloseTo(s.cleanDpBar, 12);
    expect(r.totals.pumpPressureEndOfRunBar).toBeCloseTo(1.5, 12);
  });
});

describe('sizeTrain — two-stage train at 20 °C with a hose (hand calculation)', () => {
  // Hand calculation, wine 12 %vol at 20 °C, dry:
  //   μ_wine = 1.512 mPa·s (Bingham & Jackson 1918 ratio × IAPWS R12-08); μ_water(20 °C) =
  //   1.0016 mPa·s (IAPWS R12-08); ratio 1.5096.
  //   ρ_wine = 982.35 kg/m³ (OIML R 22, 12 %vol at 20 °C).
  //   Flow = 3000 × 0.750 × 1.10 = 2475 L/h. Lot 10,000 L → 10,000/2475 = 4.0404 h.
  // Stage 1 (prefilter): 1 housing × 3 rounds × 20" = 6 equivalents, 6 × 0.6 = 3.6 m²;
  //   flux 2475/6 = 412.5 L/h per 10"; 2475/3.6 = 687.5 L m⁻² h⁻¹;
  //   clean ΔP = 0.05 × (412.5/1000) × 1.5096 = 0.03114 bar;
  //   capacity 5000 × 3.6 = 18,000 L ≥ 10,000 → 1 load, no intervention;
  //   cost 6 × 40 = 240 EUR → 240/100 hL = 2.40 EUR/hL.
  // Stage 2 (membrane): 3 rounds × 30" = 9 equivalents, 5.4 m²; flux 275 L/h per 10";
  //   458.33 L m⁻² h⁻¹; clean ΔP = 0.1 × (275/500) × 1.5096 = 0.08303 bar;
  //   capacity 1500 × 5.4 = 8100 L → ceil(10,000/8100) = 2 loads → 1 regeneration
  //   (regenerable, up to 2 per lot), 0 changes, 1 set; 8100/2475 = 3.2727 h to terminal;
  //   cost 9 × 180 = 1620 EUR → 16.20 EUR/hL.
  // Hose 38 mm × 20 m, ε 0.0015 mm: v = 4Q/(πD²) = 0.60620 m/s; Re = ρvD/μ = 14,966;
  //   Haaland (J. Fluids Eng. 105 (1983) 89–90): 1/√f = −1.8 log10[(ε/D/3.7)^1.11 + 6.9/Re]
  //   → f = 0.027776; ΔP = f·(L/D)·ρv²/2 = 2638.7 Pa = 0.026387 bar (Haaland is within
  //   ±1.5 % of Colebrook 1939, so 2 % tolerance).
  // Pump pressure, clean: 0.03114 + 0.08303 + 0.02639 + 0.2 + 0.3 = 0.64056 bar.
  // Pump pressure, end of run: 2.0 + 1.2 + 0.02639 + 0.5 = 3.72639 bar.
  // Inlet at end of run: membrane 1.2 + 0.52639 = 1.72639 bar; prefilter 3.72639 bar.
  const r = sizeTrain(baseInput());
  const [p, m] = r.stages;

  it.each([
    ['flow, L/h', r.flowLh, 2475, 1e-12],
    ['wine viscosity, Pa·s (1.512e-3)', r.wineViscosityPaS, 1.512e-3, 1e-2],
    ['wine density, kg/m³ (982.35, OIML R 22)', r.wineDensityKgM3 ?? NaN, 982.35, 1e-4],
    ['prefilter equivalents', p.elementEquivalents, 6, 0],
    ['prefilter area, m²', p.areaM2, 3.6, 1e-12],
    ['prefilter flux per 10", L/h', p.fluxLhPer10in, 412.5, 1e-12],
    ['prefilter flux, L m⁻² h⁻¹', p.fluxLmh, 687.5, 1e-12],
    ['prefilter clean ΔP, bar', p.cleanDpBar, 0.031135, 1e-2],
    ['prefilter capacity, L', p.capacityL ?? NaN, 18_000, 1e-12],
    ['prefilter cost per hL', p.costPerHl ?? NaN, 2.4, 1e-12],
    ['membrane equivalents', m.elementEquivalents, 9, 0],
    ['membrane area, m²', m.areaM2, 5.4, 1e-12],
    ['membrane flux per 10", L/h', m.fluxLhPer10in, 275, 1e-12],
    ['membrane flux, L m⁻² h⁻¹', m.fluxLmh, 458.3333, 1e-6],
    ['membrane clean ΔP, bar', m.cleanDpBar, 0.083027, 1e-2],
    ['membrane capacity, L', m.capacityL ?? NaN, 8100, 1e-12],
    ['membrane hours to terminal', m.hoursToTerminal ?? NaN, 3.272727, 1e-6],
    ['membrane cost per hL', m.costPerHl ?? NaN, 16.2, 1e-12],
    ['hose loss, bar (Haaland 1983, hand calculation)', r.totals.lineLossBar, 0.026387, 2e-2],
    ['run hours', r.totals.runHours, 4.040404, 1e-6],
    ['hold-up, L', r.totals.holdUpL, 30, 1e-12],
    ['cost total, EUR', r.totals.costTotal ?? NaN, 1860, 1e-12],
    ['cost per hL, EUR', r.totals.costPerHl ?? NaN, 18.6, 1e-12],
    ['pump pressure clean, bar', r.totals.pumpPressureCleanBar, 0.64056, 2e-3],
    ['pump pressure end of run, bar', r.totals.pumpPressureEndOfRunBar, 3.72639, 2e-4],
    ['membrane inlet at end of run, bar', m.inletPressureEndOfRunBar, 1.72639, 5e-4],
    ['prefilter inlet at end of run, bar', p.inletPressureEndOfRunBar, 3.72639, 2e-4],
  ])('%s', (_label, actual, expected, tol) => {
    if (tol === 0) expect(actual).toBe(expected);
    else expect(rel(actual, expected)).toBeLessThan(tol);
  });

  it('counts the membrane’s second load as one regeneration, no change', () => {
    expect(m.loadsNeeded).toBe(2);
    expect(m.interventions).toBe(1);
    expect(m.regenerations).toBe(1);
    expect(m.changes).toBe(0);
    expect(m.setsUsed).toBe(1);
    expect(m.interventionKind).toBe('regeneration');
    expect(p.interventionKind).toBe('none');
  });

  it('names the membrane as the limiting stage (8,100 L < 18,000 L)', () => {
    expect(r.totals.limitingStageIndex).toBe(1);
    expect(r.totals.limitingCapacityL).toBeCloseTo(8100, 9);
  });

  it('raises no warning and keeps clean and end-of-run pressures consistent', () => {
    expect(r.warnings).toEqual([]);
    expect(r.totals.cleanDpBar).toBeCloseTo(p.cleanDpBar + m.cleanDpBar, 12);
    expect(r.totals.pumpPressureCleanBar).toBeCloseTo(p.inletPressureCleanBar, 12);
    expect(r.totals.pumpPressureEndOfRunBar).toBeCloseTo(p.inletPressureEndOfRunBar, 12);
    expect(r.totals.currency).toBe('EUR');
  });
});

describe('sizeTrain — regenerations and changes (hand calculation)', () => {
  // Membrane stage of 5.4 m² on a 10,000 L lot; loads = ceil(10,000 / (capacity/m² × 5.4)).
  it.each([
    // capacity L/m², regenerable, max regen, loads, regenerations, changes, sets, kind, cost/hL (9 × 180 × sets / 100)
    ['not regenerable, 8100 L per set → ceil(1.235) = 2 loads = 1 change', 1500, false, undefined, 2, 0, 1, 2, 'change', 32.4],
    ['regenerable without limit, 8100 L → 1 regeneration', 1500, true, undefined, 2, 1, 0, 1, 'regeneration', 16.2],
    ['regenerable once, 2700 L → ceil(3.704) = 4 loads, 2 per set → 2 sets, 2 regenerations, 1 change', 500, true, 1, 4, 2, 1, 2, 'regeneration-and-change', 32.4],
    ['regenerable, 0 per lot, 2700 L → 4 loads = 3 changes', 500, true, 0, 4, 0, 3, 4, 'change', 64.8],
    ['capacity 10,800 L ≥ lot → nothing', 2000, false, undefined, 1, 0, 0, 1, 'none', 16.2],
    ['capacity exactly the lot (10,000/5.4 L/m²) → 1 load, no rounding up', 10_000 / 5.4, false, undefined, 1, 0, 0, 1, 'none', 16.2],
  ] as const)('%s', (_label, cap, regenerable, maxRegen, loads, regens, changes, sets, kind, costPerHl) => {
    const input = baseInput();
    const ct = input.stages[1].cartridgeType;
    ct.capacityLPerM2 = cap;
    ct.regenerable = regenerable;
    ct.maxRegenerationsPerLot = maxRegen;
    const m = sizeTrain(input).stages[1];
    expect(m.loadsNeeded).toBe(loads);
    expect(m.interventions).toBe(loads - 1);
    expect(m.regenerations).toBe(regens);
    expect(m.changes).toBe(changes);
    expect(m.setsUsed).toBe(sets);
    expect(m.interventionKind).toBe(kind);
    expect(m.costPerHl).toBeCloseTo(costPerHl, 9);
    expect(m.costIsLowerBound).toBe(false);
  });

  it('counts one set, flagged as a lower bound, when the capacity is unknown', () => {
    const input = baseInput();
    delete input.stages[1].cartridgeType.capacityLPerM2;
    const r = sizeTrain(input);
    expect(r.stages[1].setsUsed).toBe(1);
    expect(r.stages[1].costIsLowerBound).toBe(true);
    expect(r.stages[1].capacityL).toBeNull();
    expect(r.totals.limitingStageIndex).toBe(0);
  });
});

describe('requiredFlowLh', () => {
  it.each([
    ['3000 × 0.75 × 1.10 = 2475 (hand calculation)', { bottlesPerHour: 3000, bottleMl: 750, marginPct: 10 }, 2475],
    ['3000 × 0.75 × 1.30 = 2925 (hand calculation)', { bottlesPerHour: 3000, bottleMl: 750, marginPct: 30 }, 2925],
    ['default margin 10 %: 2000 × 0.375 × 1.10 = 825 (hand calculation)', { bottlesPerHour: 2000, bottleMl: 375 }, 825],
  ])('%s', (_l, line, expected) => {
    expect(requiredFlowLh(line)).toBeCloseTo(expected, 9);
  });
  it('uses a 10 % default margin (common practice, no source)', () => {
    expect(DEFAULT_FLOW_MARGIN_PCT).toBe(10);
  });
});

// ---------------------------------------------------------------------------------------
// Warnings
// ---------------------------------------------------------------------------------------

describe('sizeTrain — warnings', () => {
  type Case = [string, SizingWarningCode, number | undefined, (i: TrainSizingInput) => void];
  const cases: Case[] = [
    // Membrane flux 275 L/h per 10" against a design of 250 (hand calculation).
    ['flux above design', 'flux-above-design', 1, (i) => { i.stages[1].cartridgeType.designFluxLhPer10in = 250; }],
    // Membrane clean ΔP 0.0830 bar > 0.24/3 = 0.080 bar (hand calculation).
    ['clean ΔP above a third of terminal (common practice, no source)', 'clean-dp-above-third-of-terminal', 1, (i) => { i.stages[1].cartridgeType.terminalDpBar = 0.24; }],
    // Prefilter inlet at end of run 3.726 bar > 3.5 bar housing (hand calculation above).
    ['inlet pressure above housing rating', 'inlet-pressure-above-housing-rating', 0, (i) => { i.stages[0].housing.maxPressureBar = 3.5; }],
    // The forward-ΔP rating limits the ΔP across the cartridge (its terminal ΔP at the end of
    // the run), not the line pressure at its inlet (maker data sheets, common practice, no source).
    ['stage ΔP at terminal above cartridge max forward ΔP', 'stage-dp-above-cartridge-max-dp', 0, (i) => { i.stages[0].cartridgeType.maxDpForwardBar = i.stages[0].cartridgeType.terminalDpBar - 0.1; }],
    ['membrane with no prefilter before it', 'membrane-without-prefilter', 0, (i) => { i.stages = [i.stages[1]]; }],
    ['wine above the cartridge’s maximum temperature', 'temp-above-cartridge-max', 1, (i) => { i.stages[1].cartridgeType.maxTempC = 15; }],
    ['wine above the housing’s maximum temperature', 'temp-above-housing-max', 0, (i) => { i.stages[0].housing.maxTempC = 15; }],
    ['wine at 1 °C, below the checked 2–50 °C range', 'temp-outside-valid-range', undefined, (i) => { i.wine.tempC = 1; }],
    ['wine at 55 °C (no hoses), above the checked range', 'temp-outside-valid-range', undefined, (i) => { i.wine.tempC = 55; delete i.lineLosses; }],
    ['prices in two currencies', 'mixed-currencies', undefined, (i) => { i.stages[1].cartridgeType.currency = 'USD'; }],
  ];

  it.each(cases)('%s', (_label, code, stageIndex, mutate) => {
    const input = baseInput();
    mutate(input);
    const r = sizeTrain(input);
    const hit = r.warnings.filter((w) => w.code === code);
    expect(hit).toHaveLength(1);
    expect(hit[0].stageIndex).toBe(stageIndex);
    expect(hit[0].message.length).toBeGreaterThan(20);
    if (stageIndex !== undefined) expect(r.stages[stageIndex].warnings).toContainEqual(hit[0]);
  });

  it('uses one third as the clean-ΔP threshold (common practice, no source)', () => {
    expect(CLEAN_DP_MAX_FRACTION_OF_TERMINAL).toBeCloseTo(1 / 3, 15);
  });

  it('totals no cost when currencies differ', () => {
    const input = baseInput();
    input.stages[1].cartridgeType.currency = 'USD';
    const r = sizeTrain(input);
    expect(r.totals.costTotal).toBeNull();
    expect(r.totals.costPerHl).toBeNull();
    expect(r.stages[1].costPerHl).toBeCloseTo(16.2, 9);
  });
});

describe('sizeTrain — invalid inputs throw RangeError', () => {
  it.each<[string, (i: TrainSizingInput) => void]>([
    ['negative lot volume', (i) => { i.batchL = -1; }],
    ['NaN temperature', (i) => { i.wine.tempC = NaN; }],
    ['wine at 70 °C (viscosity model 0–60 °C)', (i) => { i.wine.tempC = 70; }],
    ['hoses with wine at 45 °C (OIML R 22 density −20 to 40 °C)', (i) => { i.wine.tempC = 45; }],
    ['no stages', (i) => { i.stages = []; }],
    ['a 25-inch housing', (i) => { (i.stages[0].housing as { lengthIn: number }).lengthIn = 25; }],
    ['1.5 housings', (i) => { i.stages[0].housingCount = 1.5; }],
    ['zero rounds', (i) => { i.stages[0].housing.rounds = 0; }],
    ['zero bottles per hour', (i) => { i.line.bottlesPerHour = 0; }],
    ['infinite area', (i) => { i.stages[0].cartridgeType.areaM2Per10in = Infinity; }],
    ['negative price', (i) => { i.stages[0].cartridgeType.pricePer10in = -3; }],
    ['zero terminal ΔP', (i) => { i.stages[1].cartridgeType.terminalDpBar = 0; }],
  ])('%s', (_label, mutate) => {
    const input = baseInput();
    mutate(input);
    expect(() => sizeTrain(input)).toThrow(RangeError);
  });
});

// ---------------------------------------------------------------------------------------
// suggestTrain
// ---------------------------------------------------------------------------------------

const OPTIONS: SizingHousing[] = [
  { rounds: 1, lengthIn: 10, maxPressureBar: 6, holdUpL: 1.5 },
  { rounds: 1, lengthIn: 30, maxPressureBar: 6, holdUpL: 5 },
  { rounds: 3, lengthIn: 20, maxPressureBar: 6, holdUpL: 12 },
  { rounds: 3, lengthIn: 30, maxPressureBar: 6, holdUpL: 20 },
];

const LIMIT_CODES: SizingWarningCode[] = [
  'flux-above-design',
  'clean-dp-above-third-of-terminal',
  'inlet-pressure-above-housing-rating',
  'stage-dp-above-cartridge-max-dp',
  'temp-above-housing-max',
  'temp-above-cartridge-max',
];

function stageMeetsLimits(input: TrainSizingInput, i: number): boolean {
  return !sizeTrain(input).stages[i].warnings.some((w) => LIMIT_CODES.includes(w.code));
}

describe('suggestTrain', () => {
  it('finds the hand-calculated minimum', () => {
    // Hand calculation at 2475 L/h: the prefilter (design 1200 L/h per 10") needs ≥ 2475/1200
    // = 2.06 → 3 equivalents: one 1 × 30" housing (3 eq, 1 housing) beats three 1 × 10" (3 eq,
    // 3 housings). The membrane (design 500) needs ≥ 4.95 → 5; no set gives 5, and of the
    // 6-equivalent sets one 3 × 20" housing beats two 1 × 30". Clean ΔPs (0.05 × 825/1000 ×
    // 1.51 = 0.062 bar ≤ 2/3; 0.1 × 412.5/500 × 1.51 = 0.125 ≤ 0.4) and inlet pressures
    // (3.73 bar ≤ 6) are within limits.
    const res = suggestTrain(baseInput(), { housingOptions: OPTIONS, maxHousingsPerStage: 4 });
    expect(res.ok).toBe(true);
    if (!res.ok) return;
    expect(res.input.stages[0].housing).toEqual(OPTIONS[1]);
    expect(res.input.stages[0].housingCount).toBe(1);
    expect(res.input.stages[1].housing).toEqual(OPTIONS[2]);
    expect(res.input.stages[1].housingCount).toBe(1);
    expect(res.result.stages.map((s) => s.elementEquivalents)).toEqual([3, 6]);
    expect(res.result.warnings.filter((w) => LIMIT_CODES.includes(w.code))).toEqual([]);
  });

  it('is the minimum over every candidate (brute force with sizeTrain)', () => {
    const res = suggestTrain(baseInput(), { housingOptions: OPTIONS, maxHousingsPerStage: 4 });
    if (!res.ok) throw new Error(res.reason);
    for (let i = 0; i < 2; i++) {
      const chosen = res.result.stages[i];
      for (const h of OPTIONS) {
        for (let count = 1; count <= 4; count++) {
          const trial: TrainSizingInput = { ...res.input, stages: res.input.stages.map((s) => ({ ...s })) };
          trial.stages[i] = { ...trial.stages[i], housing: h, housingCount: count };
          if (!stageMeetsLimits(trial, i)) continue;
          const eq = count * h.rounds * (h.lengthIn / 10);
          expect(eq).toBeGreaterThanOrEqual(chosen.elementEquivalents);
          if (eq === chosen.elementEquivalents) expect(count).toBeGreaterThanOrEqual(chosen.housingCount);
        }
      }
    }
  });

  it('uses a per-stage catalogue before the shared options', () => {
    const res = suggestTrain(baseInput(), {
      housingOptions: OPTIONS,
      housingCatalog: [undefined, [OPTIONS[3]]],
    });
    if (!res.ok) throw new Error(res.reason);
    expect(res.input.stages[1].housing).toEqual(OPTIONS[3]);
    expect(res.input.stages[1].housingCount).toBe(1);
  });

  it.each<[string, (i: TrainSizingInput) => void, SizingHousing[], number, number]>([
    // one 1 × 10" housing carries 2475 L/h per 10", above 1200 (hand calculation)
    ['too little area within the housing limit', () => {}, [OPTIONS[0]], 1, 0],
    // prefilter inlet at end of run 3.73 bar > 3 bar housings
    ['every housing rated below the inlet pressure', () => {}, OPTIONS.map((h) => ({ ...h, maxPressureBar: 3 })), 4, 0],
    ['wine hotter than the cartridge allows', (i) => { i.stages[1].cartridgeType.maxTempC = 15; }, OPTIONS, 4, 1],
    // terminal 2 bar across the prefilter > its 1.5 bar forward rating (the rating limits the ΔP across the cartridge)
    ['terminal ΔP above the cartridge’s max forward ΔP', (i) => { i.stages[0].cartridgeType.maxDpForwardBar = 1.5; }, OPTIONS, 4, 0],
    ['no housings', () => {}, [], 4, 0],
  ])('gives a reason when none fits: %s', (_label, mutate, options, maxHousings, stageIndex) => {
    const input = baseInput();
    mutate(input);
    const res = suggestTrain(input, { housingOptions: options, maxHousingsPerStage: maxHousings });
    expect(res.ok).toBe(false);
    if (res.ok) return;
    expect(res.stageIndex).toBe(stageIndex);
    expect(res.reason.length).toBeGreaterThan(10);
  });
});

// ---------------------------------------------------------------------------------------
// Properties
// ---------------------------------------------------------------------------------------

describe('sizeTrain — properties (fast-check)', () => {
  it('clean ΔP and pump pressure rise with flow (Darcy 1856, Darcy–Weisbach)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 200, max: 20_000 }),
        fc.integer({ min: 1, max: 5000 }),
        fc.double({ min: 4, max: 30, noNaN: true }),
        (bph, extra, tempC) => {
          const a = baseInput();
          a.wine.tempC = tempC;
          a.line.bottlesPerHour = bph;
          const b = baseInput();
          b.wine.tempC = tempC;
          b.line.bottlesPerHour = bph + extra;
          const ra = sizeTrain(a);
          const rb = sizeTrain(b);
          for (let i = 0; i < ra.stages.length; i++) {
            expect(rb.stages[i].cleanDpBar).toBeGreaterThan(ra.stages[i].cleanDpBar);
          }
          expect(rb.totals.lineLossBar).toBeGreaterThan(ra.totals.lineLossBar);
          expect(rb.totals.pumpPressureCleanBar).toBeGreaterThan(ra.totals.pumpPressureCleanBar);
        },
      ),
      { numRuns: 150 },
    );
  });

  it('more element equivalents never raise the flux or the clean ΔP', () => {
    const lengths = [10, 20, 30, 40] as const;
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 21 }),
        fc.integer({ min: 0, max: 3 }),
        fc.integer({ min: 1, max: 4 }),
        fc.integer({ min: 0, max: 20 }),
        fc.integer({ min: 0, max: 3 }),
        fc.integer({ min: 0, max: 3 }),
        (rounds, li, count, moreRounds, moreLi, moreCount) => {
          const small: SizingStage = { ...baseInput().stages[1], housing: { rounds, lengthIn: lengths[li], maxPressureBar: 6, holdUpL: 10 }, housingCount: count };
          const big: SizingStage = {
            ...small,
            housing: { ...small.housing, rounds: rounds + moreRounds, lengthIn: lengths[Math.min(3, li + moreLi)] },
            housingCount: count + moreCount,
          };
          const a = baseInput();
          a.stages = [a.stages[0], small];
          const b = baseInput();
          b.stages = [b.stages[0], big];
          const sa = sizeTrain(a).stages[1];
          const sb = sizeTrain(b).stages[1];
          expect(sb.elementEquivalents).toBeGreaterThanOrEqual(sa.elementEquivalents);
          expect(sb.fluxLhPer10in).toBeLessThanOrEqual(sa.fluxLhPer10in);
          expect(sb.fluxLmh).toBeLessThanOrEqual(sa.fluxLmh);
          expect(sb.cleanDpBar).toBeLessThanOrEqual(sa.cleanDpBar * (1 + 1e-12));
          // flux × equivalents = flow (definition)
          expect(rel(sa.fluxLhPer10in * sa.elementEquivalents, 2475)).toBeLessThan(1e-12);
        },
      ),
      { numRuns: 200 },
    );
  });

  it('never returns NaN for valid inputs', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 40, noNaN: true }),
        fc.double({ min: 0, max: 16, noNaN: true }),
        fc.double({ min: 0, max: 150, noNaN: true }),
        fc.double({ min: 100, max: 100_000, noNaN: true }),
        (tempC, eth, sugar, batchL) => {
          const input = baseInput();
          input.wine = { tempC, ethanolPctVol: eth, sugarGPerL: sugar };
          input.batchL = batchL;
          const r = sizeTrain(input);
          const nums = [r.totals.pumpPressureCleanBar, r.totals.pumpPressureEndOfRunBar, r.totals.costPerHl ?? 0, ...r.stages.map((s) => s.cleanDpBar)];
          for (const v of nums) expect(Number.isFinite(v)).toBe(true);
        },
      ),
      { numRuns: 100 },
    );
  });
});

describe('elementEquivalents', () => {
  // Trade convention: a cartridge of n × 10-inch modules counts as n ten-inch equivalents (common practice, no source).
  it.each([
    [3, 30, 9],
    [1, 10, 1],
    [12, 40, 48],
    [0, 20, 0],
  ])('%i cartridges of %i inches → %i', (cartridges, lengthIn, eq) => {
    expect(elementEquivalents({ cartridges, lengthIn })).toBe(eq);
  });

  it.each([
    [2.5, 30],
    [-1, 10],
    [3, 25],
  ])('refuses %d cartridges of %d inches', (cartridges, lengthIn) => {
    expect(() => elementEquivalents({ cartridges, lengthIn })).toThrow(RangeError);
  });
});

// ---------------------------------------------------------------------------------------
// Plans you can approve with confidence (limits, feasibility, cost spread, housings)
// ---------------------------------------------------------------------------------------

describe('sizeTrain — limits a plan must not break', () => {
  it('a stage whose clean ΔP reaches its terminal ΔP is infeasible: capacity 0, no loads, a stop warning', () => {
    // Cold wine raises viscosity (Darcy: ΔP ∝ μ); a terminal ΔP just below the clean ΔP makes the
    // stage unable to hold any wine — by definition of the terminal ΔP (common practice, no source).
    const input = baseInput();
    const clean = sizeTrain(input).stages[1].cleanDpBar;
    input.stages[1].cartridgeType.terminalDpBar = clean * 0.96;
    const r = sizeTrain(input);
    const s = r.stages[1];
    expect(s.infeasible).toBe(true);
    expect(s.capacityL).toBe(0);
    expect(s.loadsNeeded).toBeNull();
    expect(r.totals.limitingStageIndex).toBe(1);
    expect(r.totals.limitingCapacityL).toBe(0);
    expect(r.warnings.map((w) => w.code)).toContain('stage-infeasible');
    expect(Number.isFinite(s.costPerHl ?? 0)).toBe(true);
  });

  it('at 2 °C a membrane with clean ΔP 1.25 bar above its terminal 1.20 bar reports no capacity (issue example)', () => {
    const input = baseInput();
    input.wine.tempC = 2;
    const clean = sizeTrain(input).stages[1].cleanDpBar;
    // Scale the medium so the clean ΔP at 2 °C is 1.25 bar (ΔP ∝ 1/water flow at a given water ΔP, Darcy 1856).
    input.stages[1].cartridgeType.waterFlowLhPer10in *= clean / 1.25;
    input.stages[1].cartridgeType.terminalDpBar = 1.2;
    input.stages[1].cartridgeType.maxDpForwardBar = 5;
    const s = sizeTrain(input).stages[1];
    expect(s.cleanDpBar).toBeCloseTo(1.25, 6);
    expect(s.capacityL).toBe(0);
    expect(s.infeasible).toBe(true);
  });

  it('checks the forward-ΔP rating against the stage’s own ΔP, not the inlet pressure (maker data sheets, common practice, no source)', () => {
    const input = baseInput();
    input.lineLosses = { hoses: [], staticHeadBar: 0, fillerInletBar: 4 }; // inlet 6+ bar, stage ΔP ≤ 2 bar
    const r = sizeTrain(input);
    expect(r.stages[0].inletPressureEndOfRunBar).toBeGreaterThan(5);
    expect(r.warnings.map((w) => w.code)).not.toContain('stage-dp-above-cartridge-max-dp');
  });

  it('does not ask for a prefilter before a membrane that follows another membrane (common practice, no source)', () => {
    const input = baseInput();
    const membrane = input.stages[1];
    input.stages = [
      { ...membrane, name: '0.65 µm', cartridgeType: { ...membrane.cartridgeType, ratingUm: 0.65 } },
      { ...membrane, name: '0.45 µm' },
    ];
    const codes = sizeTrain(input).warnings.filter((w) => w.code === 'membrane-without-prefilter');
    expect(codes.map((w) => w.stageIndex)).toEqual([0]);
  });

  it('one housing in two stages is a stop', () => {
    const input = baseInput();
    input.stages[0].housingId = 'h-1';
    input.stages[1].housingId = 'h-1';
    const hit = sizeTrain(input).warnings.filter((w) => w.code === 'housing-in-two-stages');
    expect(hit).toHaveLength(1);
    expect(hit[0].stageIndex).toBe(1);
    input.stages[1].housingId = 'h-2';
    expect(sizeTrain(input).warnings.map((w) => w.code)).not.toContain('housing-in-two-stages');
  });

  it('checks sanitation against every rating: steam at 121 °C over cartridges rated 80 °C (SIP 121 °C from memory; hot water 82 °C, trade practice §5.2)', () => {
    expect(SANITATION_TEMP_C.steam).toBe(121);
    expect(SANITATION_TEMP_C['hot-water']).toBe(82);
    const input = baseInput();
    input.stages[0].cartridgeType.maxTempC = 80;
    input.stages[1].cartridgeType.maxTempC = 140;
    input.stages[1].housing.maxTempC = 100;
    input.sanitation = { kind: 'steam' };
    const codes = sizeTrain(input).warnings.map((w) => `${w.code}@${String(w.stageIndex)}`);
    expect(codes).toContain('sanitation-above-cartridge-max@0');
    expect(codes).toContain('sanitation-above-housing-max@1');
    expect(codes).not.toContain('sanitation-above-cartridge-max@1');
    input.sanitation = { kind: 'hot-water' };
    expect(sizeTrain(input).warnings.map((w) => w.code)).toContain('sanitation-above-cartridge-max'); // 82 > 80
    input.stages[0].cartridgeType.maxTempC = 90;
    input.stages[1].housing.maxTempC = 130;
    expect(sizeTrain(input).warnings.map((w) => w.code).filter((c) => c.startsWith('sanitation'))).toEqual([]);
  });
});

describe('sizeTrain — cost per hL spread over a regenerable set’s life', () => {
  // Hand calculation (common practice, no source): a regenerable set of 3 × 30-inch membranes
  // (9 modules × 180 € = 1,620 €) that serves 51 loads in its life (50 rated hot-water cycles + 1)
  // costs 1,620 × loads / 51 per lot; single-use sets are charged whole to the lot.
  function regenInput(batchL: number) {
    const input = baseInput();
    input.batchL = batchL;
    input.stages[1].cartridgeType.serviceLifeLoads = 51;
    return input;
  }

  it('a 12,000 L white pays its share of the set, not the whole set', () => {
    const r = sizeTrain(regenInput(12_000));
    const m = r.stages[1];
    expect(m.costBasis).toBe('service-life');
    const loads = m.loadsNeeded ?? 1;
    expect(m.costTotal).toBeCloseTo((m.costPerSet! * loads) / 51, 9);
    expect(m.costPerHl!).toBeLessThan(5);
    const whole = sizeTrain({ ...regenInput(12_000), stages: [baseInput().stages[0], { ...baseInput().stages[1] }] }).stages[1];
    expect(whole.costBasis).toBe('whole-set');
    expect(whole.costPerHl!).toBeGreaterThan(m.costPerHl! * 10);
  });

  it('a 100 L lot no longer carries thousands per hL', () => {
    const m = sizeTrain(regenInput(100)).stages[1];
    expect(m.costTotal).toBeCloseTo(m.costPerSet! / 51, 9);
    expect(m.costPerHl!).toBeCloseTo(m.costPerSet! / 51 / 1, 9);
  });

  it('single-use prefilters are charged whole to the lot, and "at least" carries to the total', () => {
    const input = regenInput(12_000);
    delete input.stages[0].cartridgeType.capacityLPerM2;
    const r = sizeTrain(input);
    expect(r.stages[0].costBasis).toBe('single-use');
    expect(r.stages[0].costIsLowerBound).toBe(true);
    expect(r.totals.costIsLowerBound).toBe(true);
    expect(sizeTrain(regenInput(12_000)).totals.costIsLowerBound).toBe(false);
  });
});

describe('suggestTrain — one housing per stage', () => {
  it('never gives the same housing to two stages', () => {
    const input = baseInput();
    const big = { ...OPTIONS[3], id: 'big' };
    const other = { ...OPTIONS[3], id: 'other', holdUpL: 25 };
    const res = suggestTrain(input, { housingOptions: [big, other], maxHousingsPerStage: 1 });
    if (!res.ok) throw new Error(res.reason);
    expect(res.input.stages.map((st) => st.housingId)).toEqual(['big', 'other']);
    expect(sizeTrain(res.input).warnings.map((w) => w.code)).not.toContain('housing-in-two-stages');
    const alone = suggestTrain(input, { housingOptions: [big], maxHousingsPerStage: 1 });
    expect(alone.ok).toBe(false);
    if (!alone.ok) expect(alone.reason).toMatch(/earlier stage/);
  });
});

describe('capacity from the lot’s Vmax disc test', () => {
  it('v_T = v_max(1 − √(ΔP0/ΔP_T)): 200 L/m², 0.2 → 2.0 bar gives 136.754 L/m² (shared reference "engineering" §7.4 table, standard blocking at r = 10)', () => {
    expect(capacityFromVmax({ vmaxLPerM2: 200, cleanDpBar: 0.2, terminalDpBar: 2, safetyFactor: 1 })).toBeCloseTo(136.754, 3);
  });
  it('divides by the safety factor (default 1.5; "SF commonly 1.5–2", §7.5, from memory)', () => {
    expect(DEFAULT_VMAX_SAFETY_FACTOR).toBe(1.5);
    expect(capacityFromVmax({ vmaxLPerM2: 200, cleanDpBar: 0.2, terminalDpBar: 2 })).toBeCloseTo(136.754 / 1.5, 3);
  });
  it('is 0 when the clean ΔP reaches the terminal ΔP, and refuses a safety factor below 1', () => {
    expect(capacityFromVmax({ vmaxLPerM2: 500, cleanDpBar: 1.25, terminalDpBar: 1.2 })).toBe(0);
    expect(() => capacityFromVmax({ vmaxLPerM2: 500, cleanDpBar: 0.1, terminalDpBar: 1.2, safetyFactor: 0.5 })).toThrow(RangeError);
  });
  it('sizes a membrane stage without a typed capacity from the lot’s Vmax at the stage’s own clean ΔP, and says so', () => {
    const input = baseInput();
    delete input.stages[1].cartridgeType.capacityLPerM2;
    input.wine.vmaxLPerM2 = 900;
    const r = sizeTrain(input);
    const m = r.stages[1];
    expect(m.capacitySource).toBe('vmax');
    const expected = capacityFromVmax({ vmaxLPerM2: 900, cleanDpBar: m.cleanDpBar, terminalDpBar: m.terminalDpBar });
    expect(m.capacityLPerM2).toBeCloseTo(expected, 9);
    expect(m.capacityL).toBeCloseTo(expected * m.areaM2, 6);
    // A typed capacity wins; prefilters never take the membrane disc's Vmax.
    expect(r.stages[0].capacitySource).toBe('stage');
    delete input.stages[0].cartridgeType.capacityLPerM2;
    expect(sizeTrain(input).stages[0].capacitySource).toBeNull();
  });
});
