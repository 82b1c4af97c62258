/**
 * Filterability of a wine and the membrane area it needs.
 *
 * - Clogging index (filterability index, "indice de colmatage"): a constant-pressure
 *   disc test (25 mm membrane disc, 2 bar) timing the first 200 mL and 400 mL of
 *   filtrate; IC = T400 − 2·T200 in seconds. A wine that does not foul gives an index
 *   close to zero. Method and bands as described by Oenopedia §6.1.1.b, citing
 *   H. Romat, *Filtration en œnologie*, Féret (2014); also AWRI "Filtration – physical
 *   removal of microorganisms" and the Winetech Technical Yearbook 2019, p. 168.
 * - Vmax sizing: standard (gradual pore) blocking at constant pressure,
 *   t/V = 1/Q0 + t/V_max (Badmington, Wilkins, Payne & Honig, Pharm. Technol. 19(9)
 *   (1995) 64–76; analysed by Zydney & Ho, Desalination 146 (2002) 75–81; the law
 *   itself after Grace 1956 and Hermia 1982).
 *
 * The Vmax fit of a disc test lives in the constant-pressure fitting module; this
 * module takes its per-area results (v_max, J0).
 */
import { requireFinite, requirePositive } from './errors';

// ---------------------------------------------------------------------------
// Clogging index
// ---------------------------------------------------------------------------

/**
 * Clogging index (filterability index) IC = T400 − 2·T200, in seconds.
 *
 * T200 and T400 are the cumulative times (s) for the first 200 mL and the first
 * 400 mL of filtrate through a 25 mm membrane disc at a constant 2 bar. The second
 * 200 mL takes T400 − T200; if the disc did not foul it would take T200 again, so the
 * index is the extra time the second 200 mL needed. A slightly negative result is
 * possible (wetting and start-up effects in the first 200 mL) and is returned as is.
 * Source: Oenopedia §6.1.1.b citing Romat 2014; Winetech Technical Yearbook 2019.
 *
 * @param t200s cumulative time to 200 mL, s (> 0)
 * @param t400s cumulative time to 400 mL, s (> t200s)
 * @returns the clogging index, s
 * @throws RangeError for non-finite or non-positive times, or T400 ≤ T200
 */
export function cloggingIndex(t200s: number, t400s: number): number {
  requirePositive('time to 200 mL', t200s);
  requirePositive('time to 400 mL', t400s);
  if (t400s <= t200s) {
    throw new RangeError(
      `The time to 400 mL (${String(t400s)} s) must be longer than the time to 200 mL (${String(t200s)} s): both are cumulative times from the start of the test.`,
    );
  }
  return t400s - 2 * t200s;
}

/**
 * Modified clogging index FIm = (T600 − T200) − 2·(T400 − T200) = T600 − 2·T400 + T200, s.
 *
 * Same constant-pressure disc test, with a third reading at 600 mL. The first 200 mL
 * (wetting and start-up effects) is left out: the index is the extra time the third
 * 200 mL (T600 − T400) took over the second (T400 − T200). Source: a US winemaking
 * supplier's "Filtration checklist for successful bottling" (trade literature).
 *
 * @param t200s cumulative time to 200 mL, s (> 0)
 * @param t400s cumulative time to 400 mL, s (> t200s)
 * @param t600s cumulative time to 600 mL, s (> t400s)
 * @returns the modified clogging index, s (may be slightly negative)
 * @throws RangeError for non-finite or non-positive times, or times not increasing
 */
export function modifiedCloggingIndex(t200s: number, t400s: number, t600s: number): number {
  requirePositive('time to 200 mL', t200s);
  requirePositive('time to 400 mL', t400s);
  requirePositive('time to 600 mL', t600s);
  if (!(t200s < t400s && t400s < t600s)) {
    throw new RangeError(
      `Times to 200, 400 and 600 mL must increase (got ${String(t200s)}, ${String(t400s)}, ${String(t600s)} s): they are cumulative times from the start of the test.`,
    );
  }
  return t600s - 2 * t400s + t200s;
}

/**
 * Filterability ratio: volume passed between 30 and 90 s divided by the volume passed
 * between 120 and 180 s of a constant-pressure disc test (dimensionless). 1 means no
 * fouling; the ratio grows as the disc blocks. Source: NMIT (Nelson, NZ)
 * wine-finishing course notes, Dec 2020.
 *
 * @param volume30to90Ml  filtrate collected from 30 s to 90 s, mL (> 0)
 * @param volume120to180Ml filtrate collected from 120 s to 180 s, mL (> 0)
 */
export function filterabilityRatio(volume30to90Ml: number, volume120to180Ml: number): number {
  requirePositive('volume passed from 30 to 90 s', volume30to90Ml);
  requirePositive('volume passed from 120 to 180 s', volume120to180Ml);
  return volume30to90Ml / volume120to180Ml;
}

// ---------------------------------------------------------------------------
// Interpretation bands
// ---------------------------------------------------------------------------

/** Limits of one interpretation band; `null` means open-ended on that side. */
export type BandLimits = {
  min: number | null;
  max: number | null;
  includesMin: boolean;
  includesMax: boolean;
};

/** One band of an interpretation scale. */
export type Band<B extends string> = { band: B; label: string; limits: BandLimits };

/** A published interpretation scale: bands in increasing order of the index. */
export type BandScale<B extends string> = {
  /** what is measured, with its test conditions */
  index: string;
  /** unit of the index */
  unit: string;
  /** published source of the bands */
  source: string;
  bands: readonly Band<B>[];
};

/** Bands of the clogging index on the Romat scale. */
export type CloggingIndexBand = 'very-good' | 'good' | 'poor' | 'very-poor';

/**
 * Clogging-index bands for a 0.65 µm, 25 mm disc at 2 bar (Romat 2014 via Oenopedia):
 * IC < 25 very good (membrane filtration without clogging); 25–50 good (trouble if the
 * filter is undersized); 50–100 poor (fast clogging, poorer microbial retention);
 * > 100 very poor (prefilter or re-treat). The printed boundaries "< 25" and "> 100"
 * are kept exactly; 50 falls in "good" (the printed "25–50").
 */
export const ROMAT_CLOGGING_INDEX_SCALE: BandScale<CloggingIndexBand> = {
  index: 'clogging index IC, 0.65 µm 25 mm disc, 2 bar',
  unit: 's',
  // Romat 2014 via Oenopedia §6.1.1.b
  source: 'H. Romat, Filtration en œnologie, Féret (2014), as quoted by Oenopedia §6.1.1.b',
  bands: [
    {
      band: 'very-good',
      label: 'Very good: membrane filtration without clogging',
      limits: { min: null, max: 25, includesMin: false, includesMax: false },
    },
    {
      band: 'good',
      label: 'Good: trouble only if the filter is undersized',
      limits: { min: 25, max: 50, includesMin: true, includesMax: true },
    },
    {
      band: 'poor',
      label: 'Poor: fast clogging, poorer microbial retention',
      limits: { min: 50, max: 100, includesMin: false, includesMax: true },
    },
    {
      band: 'very-poor',
      label: 'Very poor: prefilter or re-treat the wine first',
      limits: { min: 100, max: null, includesMin: false, includesMax: false },
    },
  ],
};

/** Two-band (pass / fail) filterability-index scales quoted in the trade. */
export type PassFailBand = 'pass' | 'fail';

/**
 * Single-threshold filterability scales used in the trade, each with its source:
 * - IC ≤ 20 for membrane filtration under good conditions — Chambre d'agriculture de la
 *   Gironde (Vinopôle), "Filtration sur cartouches : de multiples avantages"; also a
 *   French wine-filtration consultant.
 * - FI < 20 low blocking potential, > 20 expect blockage (0.45 µm disc, 2 barg) — a UK
 *   filter supplier; NMIT wine-finishing course notes (Dec 2020).
 * - FI < 30 ready with long membrane life, > 30 prefilter first — a Bulgarian
 *   lab-equipment maker's filterability-index page.
 */
export const PASS_FAIL_FILTERABILITY_SCALES: readonly BandScale<PassFailBand>[] = [
  {
    index: 'clogging index IC (membrane filtration under good conditions)',
    unit: 's',
    // Chambre d'agriculture de la Gironde (Vinopôle)
    source: "Chambre d'agriculture de la Gironde (Vinopôle), \"Filtration sur cartouches : de multiples avantages\"",
    bands: [
      { band: 'pass', label: 'Suitable for membrane filtration', limits: { min: null, max: 20, includesMin: false, includesMax: true } },
      { band: 'fail', label: 'Prefilter or re-treat first', limits: { min: 20, max: null, includesMin: false, includesMax: false } },
    ],
  },
  {
    index: 'filterability index FI, 0.45 µm disc, 2 barg',
    unit: 's',
    // UK filter supplier; NMIT course notes
    source: 'a UK filter supplier; NMIT (Nelson, NZ) wine-finishing course notes, Dec 2020',
    bands: [
      { band: 'pass', label: 'Low blocking potential', limits: { min: null, max: 20, includesMin: false, includesMax: false } },
      { band: 'fail', label: 'Expect blockage', limits: { min: 20, max: null, includesMin: true, includesMax: false } },
    ],
  },
  {
    index: 'filterability index FI',
    unit: 's',
    // Bulgarian lab-equipment maker
    source: "a Bulgarian lab-equipment maker's filterability-index page",
    bands: [
      { band: 'pass', label: 'Ready, long membrane life', limits: { min: null, max: 30, includesMin: false, includesMax: false } },
      { band: 'fail', label: 'Prefilter first', limits: { min: 30, max: null, includesMin: true, includesMax: false } },
    ],
  },
];

/** Bands of a disc-test Vmax on the Romat scale. */
export type VmaxDiscBand = 'very-good' | 'average' | 'poor' | 'unfilterable';

/**
 * Vmax bands for the 0.65 µm, 25 mm disc (Romat 2014 via Oenopedia), in mL through the
 * disc (units as printed, read as mL): > 4,000 very good; 2,500–4,000 average;
 * 1,500–2,500 poor (weak microbial retention); < 1,500 cannot be membrane-filtered
 * correctly. A shared boundary belongs to the better band.
 */
export const ROMAT_VMAX_DISC_SCALE: BandScale<VmaxDiscBand> = {
  index: 'Vmax of a 0.65 µm 25 mm disc',
  unit: 'mL',
  // Romat 2014 via Oenopedia §6.1.1.b
  source: 'H. Romat, Filtration en œnologie, Féret (2014), as quoted by Oenopedia §6.1.1.b',
  bands: [
    {
      band: 'unfilterable',
      label: 'Cannot be membrane-filtered correctly',
      limits: { min: null, max: 1500, includesMin: false, includesMax: false },
    },
    {
      band: 'poor',
      label: 'Poor: weak microbial retention',
      limits: { min: 1500, max: 2500, includesMin: true, includesMax: false },
    },
    {
      band: 'average',
      label: 'Average',
      limits: { min: 2500, max: 4000, includesMin: true, includesMax: true },
    },
    {
      band: 'very-good',
      label: 'Very good',
      limits: { min: 4000, max: null, includesMin: false, includesMax: false },
    },
  ],
};

/** Bands of the filterability ratio. */
export type FilterabilityRatioBand = 'good' | 'moderate' | 're-filter';

/**
 * Filterability-ratio bands (NMIT wine-finishing course notes, Dec 2020):
 * 1.0–1.5 good; 1.5–2.0 moderate (filter slower); > 2.0 re-filter. Values below 1.0
 * (the later interval passed more) fall in "good".
 */
export const FILTERABILITY_RATIO_SCALE: BandScale<FilterabilityRatioBand> = {
  index: 'filterability ratio (volume 30–90 s ÷ volume 120–180 s)',
  unit: '',
  // NMIT (Nelson, NZ) course notes
  source: 'NMIT (Nelson, NZ) wine-finishing course notes, Dec 2020',
  bands: [
    { band: 'good', label: 'Good', limits: { min: null, max: 1.5, includesMin: false, includesMax: true } },
    { band: 'moderate', label: 'Moderate: filter slower', limits: { min: 1.5, max: 2, includesMin: false, includesMax: true } },
    { band: 're-filter', label: 'Re-filter before membrane filtration', limits: { min: 2, max: null, includesMin: false, includesMax: false } },
  ],
};

function inLimits(x: number, l: BandLimits): boolean {
  if (l.min !== null && (l.includesMin ? x < l.min : x <= l.min)) return false;
  if (l.max !== null && (l.includesMax ? x > l.max : x >= l.max)) return false;
  return true;
}

/**
 * The band of `scale` that contains `value`.
 * @throws RangeError for a non-finite value, or if no band contains it
 */
export function bandOf<B extends string>(scale: BandScale<B>, value: number): Band<B> {
  requireFinite(scale.index, value);
  const hit = scale.bands.find((b) => inLimits(value, b.limits));
  if (!hit) {
    throw new RangeError(`${String(value)} ${scale.unit} lies outside every band of the ${scale.index} scale.`);
  }
  return hit;
}

/**
 * Interpretation band of a clogging index (s), on the Romat 2014 scale for a 0.65 µm
 * 25 mm disc at 2 bar (via Oenopedia §6.1.1.b): very good < 25 ≤ good ≤ 50 < poor ≤ 100
 * < very poor. Pass another scale to use a different one.
 * @param ci clogging index, s (finite; negative values fall in the best band)
 * @returns { band, label, limits }
 */
export function cloggingIndexBand(
  ci: number,
  scale: BandScale<CloggingIndexBand> = ROMAT_CLOGGING_INDEX_SCALE,
): Band<CloggingIndexBand> {
  return bandOf(scale, ci);
}

/**
 * Interpretation band of a disc-test Vmax (mL through a 0.65 µm 25 mm disc), Romat 2014
 * via Oenopedia §6.1.1.b.
 * @param vmaxMl disc Vmax, mL (> 0)
 */
export function vmaxDiscBand(vmaxMl: number): Band<VmaxDiscBand> {
  requirePositive('disc Vmax', vmaxMl);
  return bandOf(ROMAT_VMAX_DISC_SCALE, vmaxMl);
}

/**
 * Interpretation band of a filterability ratio (NMIT course notes, Dec 2020).
 * @param ratio filterability ratio (> 0)
 */
export function filterabilityRatioBand(ratio: number): Band<FilterabilityRatioBand> {
  requirePositive('filterability ratio', ratio);
  return bandOf(FILTERABILITY_RATIO_SCALE, ratio);
}

// ---------------------------------------------------------------------------
// Vmax sizing
// ---------------------------------------------------------------------------

/** Inputs of Vmax sizing (per-area results of a constant-pressure test). */
export type VmaxSizingInput = {
  /** batch volume to filter, L (> 0) */
  batchL: number;
  /** time allowed to filter the batch, h (> 0) */
  hours: number;
  /** maximum volume per area v_max = V_max/A_test, L/m² (> 0) */
  vmaxLPerM2: number;
  /** initial flux J0 = Q0/A_test at the test pressure, L m⁻² h⁻¹ (> 0) */
  j0LPerM2H: number;
  /** safety factor applied to the minimum area (≥ 1; commonly 1.5–2) */
  safetyFactor: number;
};

function checkVmaxInputs(p: { batchL: number; hours: number; vmaxLPerM2: number; j0LPerM2H: number }): void {
  requirePositive('batch volume', p.batchL);
  requirePositive('filtration time', p.hours);
  requirePositive('Vmax per area', p.vmaxLPerM2);
  requirePositive('initial flux J0', p.j0LPerM2H);
}

function checkSafetyFactor(sf: number): void {
  requireFinite('safety factor', sf);
  if (sf < 1) {
    throw new RangeError(`Safety factor must be at least 1 (got ${String(sf)}); a factor below 1 would undersize the filter.`);
  }
}

/**
 * Minimum membrane area (m²) to filter `batchL` litres in `hours` at the test pressure,
 * from standard blocking at constant pressure (Badmington et al. 1995; Zydney & Ho 2002):
 * A_min = V_b/v_max + V_b/(J0·t_b).
 * @returns m²
 */
export function vmaxMinArea(p: Omit<VmaxSizingInput, 'safetyFactor'>): number {
  checkVmaxInputs(p);
  return p.batchL / p.vmaxLPerM2 + p.batchL / (p.j0LPerM2H * p.hours);
}

/**
 * Membrane area to install (m²): A_install = SF·A_min with
 * A_min = V_b/v_max + V_b/(J0·t_b), from standard (gradual pore) blocking at constant
 * pressure, t/V = 1/Q0 + t/V_max (Badmington et al., Pharm. Technol. 1995; Zydney & Ho,
 * Desalination 2002). The relation holds at the test pressure, temperature and wine lot.
 *
 * @param p.batchL       batch volume V_b, L (> 0)
 * @param p.hours        time allowed t_b, h (> 0)
 * @param p.vmaxLPerM2   v_max, L/m² (> 0)
 * @param p.j0LPerM2H    J0, L m⁻² h⁻¹ (> 0)
 * @param p.safetyFactor SF (≥ 1)
 * @returns area to install, m²
 */
export function vmaxArea(p: VmaxSizingInput): number {
  checkSafetyFactor(p.safetyFactor);
  return p.safetyFactor * vmaxMinArea(p);
}

/**
 * Flux at the end of the batch time under standard blocking at constant pressure,
 * J(t_b) = J0/(1 + J0·t_b/v_max)², L m⁻² h⁻¹ (Badmington et al. 1995; Hermia 1982 with
 * k_s = 2/v_max). A check on Vmax sizing: the flux has fallen to this by the end of the
 * batch, whatever the area (constant pressure).
 * @returns L m⁻² h⁻¹
 */
export function vmaxEndFlux(p: { hours: number; vmaxLPerM2: number; j0LPerM2H: number }): number {
  requirePositive('filtration time', p.hours);
  requirePositive('Vmax per area', p.vmaxLPerM2);
  requirePositive('initial flux J0', p.j0LPerM2H);
  const d = 1 + (p.j0LPerM2H * p.hours) / p.vmaxLPerM2;
  return p.j0LPerM2H / (d * d);
}

/**
 * Number of elements (10-inch modules, or whole cartridges) needed to provide an area:
 * n = ceil(A_install/A_element). A ratio within 1e-9 of a whole number counts as that
 * number, so rounding noise does not add an element.
 * @param areaM2        area to install, m² (≥ 0)
 * @param elementAreaM2 filter area of one element, m² (> 0)
 */
export function elementsNeeded(areaM2: number, elementAreaM2: number): number {
  requireFinite('area to install', areaM2);
  if (areaM2 < 0) throw new RangeError(`Area to install cannot be negative (got ${String(areaM2)}).`);
  requirePositive('element area', elementAreaM2);
  const ratio = areaM2 / elementAreaM2;
  const nearest = Math.round(ratio);
  if (Math.abs(ratio - nearest) <= 1e-9 * Math.max(1, nearest)) return nearest;
  return Math.ceil(ratio);
}

/** Result of {@link vmaxSizing}. */
export type VmaxSizing = {
  /** V_b/v_max, m²: the area the batch needs for capacity alone */
  capacityAreaM2: number;
  /** V_b/(J0·t_b), m²: the area the batch needs for flow alone */
  flowAreaM2: number;
  /** A_min = capacity + flow term, m² */
  minAreaM2: number;
  /** A_install = SF·A_min, m² */
  installAreaM2: number;
  /** elements of `elementAreaM2` to reach A_install, or null if no element area was given */
  elements: number | null;
  /** installed area with that many elements, m², or null */
  installedAreaM2: number | null;
  /** J(t_b) = J0/(1 + J0 t_b/v_max)², L m⁻² h⁻¹ */
  endFluxLPerM2H: number;
  /** J(t_b)/J0 */
  endFluxFraction: number;
};

/**
 * Full Vmax sizing: A_min and its two terms, A_install = SF·A_min, elements
 * n = ceil(A_install/A_element) and the end-of-batch flux check
 * J(t_b) = J0/(1 + J0 t_b/v_max)² (Badmington et al. 1995; Zydney & Ho 2002).
 * @param p as {@link vmaxArea}, plus optional `elementAreaM2` (m² per element, > 0)
 */
export function vmaxSizing(p: VmaxSizingInput & { elementAreaM2?: number }): VmaxSizing {
  checkVmaxInputs(p);
  checkSafetyFactor(p.safetyFactor);
  const capacityAreaM2 = p.batchL / p.vmaxLPerM2;
  const flowAreaM2 = p.batchL / (p.j0LPerM2H * p.hours);
  const minAreaM2 = capacityAreaM2 + flowAreaM2;
  const installAreaM2 = p.safetyFactor * minAreaM2;
  let elements: number | null = null;
  let installedAreaM2: number | null = null;
  if (p.elementAreaM2 !== undefined) {
    elements = elementsNeeded(installAreaM2, p.elementAreaM2);
    installedAreaM2 = elements * p.elementAreaM2;
  }
  const endFluxLPerM2H = vmaxEndFlux(p);
  return {
    capacityAreaM2,
    flowAreaM2,
    minAreaM2,
    installAreaM2,
    elements,
    installedAreaM2,
    endFluxLPerM2H,
    endFluxFraction: endFluxLPerM2H / p.j0LPerM2H,
  };
}

/** Result of {@link scaleUpArea}. */
export type ScaleUp = {
  /** element area ÷ disc area */
  areaRatio: number;
  /** disc Vmax per unit area, L/m² */
  vmaxLPerM2: number;
  /** Vmax scaled to one element (same wine, pressure and temperature), L */
  vmaxLPerElement: number;
};

/**
 * Scale a disc test up to a filter element by area: v_max = V_max,disc/A_disc and
 * V_max,element = v_max·A_element (linear scale-up by area, the basis of the Vmax method,
 * Badmington et al. 1995). The result is the theoretical volume as the flux tends to
 * zero, not the volume to a terminal ΔP; apply a safety factor.
 * @param p.discVmaxMl    Vmax of the disc, mL (> 0)
 * @param p.discAreaCm2   working area of the disc, cm² (> 0; about 3.5–4 cm² for 25 mm)
 * @param p.elementAreaM2 filter area of one element, m² (> 0)
 */
export function scaleUpArea(p: { discVmaxMl: number; discAreaCm2: number; elementAreaM2: number }): ScaleUp {
  requirePositive('disc Vmax', p.discVmaxMl);
  requirePositive('disc area', p.discAreaCm2);
  requirePositive('element area', p.elementAreaM2);
  const discAreaM2 = p.discAreaCm2 / 10_000;
  const vmaxLPerM2 = p.discVmaxMl / 1000 / discAreaM2;
  return {
    areaRatio: p.elementAreaM2 / discAreaM2,
    vmaxLPerM2,
    vmaxLPerElement: vmaxLPerM2 * p.elementAreaM2,
  };
}
