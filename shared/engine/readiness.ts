/**
 * Lot readiness for membrane filtration: a verdict per wine lot from its turbidity,
 * clogging index and Vmax disc test, each judged against editable thresholds that name
 * their source. The verdict is the worst of the criteria that have data.
 *
 * Low turbidity alone does not prove a wine will filter: colloids (polysaccharides,
 * proteins, phenolics) foul membranes below 1 NTU (Wine Australia, "Top tips for
 * filtration", 2016, tip 5; Wineland, "The filterability of wine").
 */
import { z } from 'zod';
import { requireFinite, requireNonNegative, requirePositive } from './errors';

/** Wine styles the readiness thresholds distinguish. */
export type WineStyle = 'white' | 'rosé' | 'red' | 'sweet' | 'sparkling';

/** Wine styles, in display order. */
export const WINE_STYLES: readonly WineStyle[] = ['white', 'rosé', 'red', 'sweet', 'sparkling'];

/** Readiness verdict of a lot. */
export type ReadinessVerdict = 'ready' | 'borderline' | 'not-ready' | 'unknown';

const turbidityLimitSchema = z.object({
  /** turbidity at or below which the wine is clear enough, NTU */
  limitNtu: z.number().finite().positive(),
  /** band above the limit that is borderline rather than not ready, NTU (0 = none) */
  borderlineMarginNtu: z.number().finite().nonnegative(),
  /** where the figures come from */
  source: z.string().min(1),
});

/**
 * Zod schema of the readiness thresholds, so a winery can edit them (Settings).
 * - turbidity per style: ready ≤ limitNtu; borderline up to limitNtu + borderlineMarginNtu;
 *   not ready above.
 * - clogging index (s): ready ≤ readyMaxS; borderline ≤ borderlineMaxS; not ready above.
 * - clogging index validity: the test is only meaningful below validBelowNtu.
 * - Vmax: ratio v_max/planned load ≥ readyMinSafetyFactor ready; ≥ borderlineMinSafetyFactor
 *   borderline; below, not ready.
 */
export const readinessThresholdsSchema = z.object({
  turbidity: z.object({
    white: turbidityLimitSchema,
    'rosé': turbidityLimitSchema,
    red: turbidityLimitSchema,
    sweet: turbidityLimitSchema,
    sparkling: turbidityLimitSchema,
  }),
  cloggingIndex: z
    .object({
      readyMaxS: z.number().finite(),
      borderlineMaxS: z.number().finite(),
      source: z.string().min(1),
    })
    .refine((c) => c.readyMaxS <= c.borderlineMaxS, {
      message: 'The ready limit of the clogging index must not exceed its borderline limit.',
    }),
  cloggingIndexValidity: z.object({
    validBelowNtu: z.number().finite().positive(),
    source: z.string().min(1),
  }),
  vmax: z
    .object({
      readyMinSafetyFactor: z.number().finite().min(1),
      borderlineMinSafetyFactor: z.number().finite().min(1),
      source: z.string().min(1),
    })
    .refine((v) => v.borderlineMinSafetyFactor <= v.readyMinSafetyFactor, {
      message: 'The borderline safety factor for Vmax must not exceed the ready safety factor.',
    }),
});

/** Readiness thresholds (see {@link readinessThresholdsSchema}). */
export type ReadinessThresholds = z.infer<typeof readinessThresholdsSchema>;

const WHITE_SOURCE =
  'Limit: Wineland (South Africa), "The filterability of wine" (< 1.0 NTU clear enough before bottling, > 1 NTU filter again); Vitisphere, 14 Apr 2010 (buyers require < 1 NTU). Borderline margin: common practice, no source.';

/**
 * Default readiness thresholds, each with its source.
 * - White, rosé, sweet, sparkling: 1.0 NTU before membrane filtration (Wineland; buyers'
 *   < 1 NTU specification, Vitisphere 2010). Borderline margin 0.5 NTU (to 1.5 NTU) for
 *   dry styles, none for sweet wines, which must be sterile-filtered (common practice,
 *   no source).
 * - Red: 2.0 NTU before a 0.45 µm membrane, borderline up to 5.0 NTU, which some cellars
 *   accept behind a good prefilter (common practice, no source).
 * - Clogging index: ready ≤ 20 s (Chambre d'agriculture de la Gironde; UK filter
 *   supplier and NMIT FI < 20), borderline to 50 s (Romat 2014 "good, trouble if the
 *   filter is undersized"), not ready above 50 s (Romat 2014 "poor, fast clogging").
 * - The clogging-index test is only valid below 3 NTU (Oenopedia §6.1.1.b).
 * - Vmax: installed capacity v_max at least 2× the planned L/m² is ready, 1.5–2×
 *   borderline, below 1.5× not ready (safety factor 1.5–2 in Vmax sizing, from memory
 *   of bioprocess sizing practice after Badmington et al. 1995).
 */
export const defaultReadinessThresholds: ReadinessThresholds = {
  turbidity: {
    white: { limitNtu: 1.0, borderlineMarginNtu: 0.5, source: WHITE_SOURCE },
    'rosé': { limitNtu: 1.0, borderlineMarginNtu: 0.5, source: WHITE_SOURCE },
    red: {
      limitNtu: 2.0,
      borderlineMarginNtu: 3.0,
      source: 'Common practice, no source: reds < 2 NTU before a 0.45 µm membrane; some cellars accept 3–5 NTU behind a good prefilter.',
    },
    sweet: {
      limitNtu: 1.0,
      borderlineMarginNtu: 0,
      source:
        'Limit: Wineland (South Africa), "The filterability of wine"; Vitisphere, 14 Apr 2010. No borderline margin for wines that must be sterile-filtered: common practice, no source.',
    },
    sparkling: {
      limitNtu: 1.0,
      borderlineMarginNtu: 0.5,
      source:
        'Limit: Wineland (South Africa), "The filterability of wine"; Vitisphere, 14 Apr 2010 (as for still wines). Borderline margin: common practice, no source.',
    },
  },
  cloggingIndex: {
    readyMaxS: 20,
    borderlineMaxS: 50,
    source:
      "Ready ≤ 20: Chambre d'agriculture de la Gironde (Vinopôle), \"Filtration sur cartouches : de multiples avantages\"; FI < 20 also used by a UK filter supplier and NMIT course notes. Borderline to 50 and not ready above: H. Romat, Filtration en œnologie (2014), via Oenopedia §6.1.1.b.",
  },
  cloggingIndexValidity: {
    validBelowNtu: 3,
    source: 'Oenopedia §6.1.1.b, "Different filterability measurements for a wine".',
  },
  vmax: {
    readyMinSafetyFactor: 2,
    borderlineMinSafetyFactor: 1.5,
    source:
      'Vmax sizing by standard blocking (Badmington et al., Pharm. Technol. 1995); safety factor 1.5–2 from memory (bioprocess sizing practice).',
  },
};

/** Data of one lot for the readiness verdict. */
export type LotReadinessInput = {
  style: WineStyle;
  /** turbidity, NTU (≥ 0) */
  turbidityNtu?: number;
  /** clogging index T400 − 2·T200, s (finite) */
  cloggingIndex?: number;
  /** Vmax per area from a disc test, L/m² (> 0) */
  vmaxLPerM2?: number;
  /** litres planned per m² of installed membrane, L/m² (> 0) */
  plannedLPerM2?: number;
};

/** Readiness verdict with plain reasons stating the values and the thresholds. */
export type LotReadiness = { verdict: ReadinessVerdict; reasons: string[] };

const STYLE_NAME: Record<WineStyle, string> = {
  white: 'white wines',
  'rosé': 'rosé wines',
  red: 'red wines',
  sweet: 'sweet wines',
  sparkling: 'sparkling wines',
};

const RANK: Record<Exclude<ReadinessVerdict, 'unknown'>, number> = { ready: 0, borderline: 1, 'not-ready': 2 };

/** A number for a message: at least one decimal, up to three, no trailing zeros past the first. */
function fmt(x: number, minDecimals = 1): string {
  for (let d = minDecimals; d <= 3; d++) {
    const s = x.toFixed(d);
    if (Number(s) === x) return s;
  }
  return x.toFixed(3).replace(/(\.\d*?[1-9])0+$/, '$1');
}

function parseThresholds(t: ReadinessThresholds): ReadinessThresholds {
  const r = readinessThresholdsSchema.safeParse(t);
  if (!r.success) {
    const first = r.error.issues[0];
    const where = first.path.length ? ` (at ${first.path.join('.')})` : '';
    throw new RangeError(`Readiness thresholds are not valid${where}: ${first.message}`);
  }
  return r.data;
}

/**
 * The clogging index judged against the readiness limits: the one source of its verdict, for
 * the lot's readiness and for the badge beside each lab result (ready ≤ readyMaxS;
 * borderline ≤ borderlineMaxS; not ready above; sources in {@link defaultReadinessThresholds}).
 */
export function cloggingIndexVerdict(
  ci: number,
  limits: Pick<ReadinessThresholds['cloggingIndex'], 'readyMaxS' | 'borderlineMaxS'> = defaultReadinessThresholds.cloggingIndex,
): { verdict: 'ready' | 'borderline' | 'not-ready'; reason: string; short: string } {
  requireFinite('clogging index', ci);
  if (ci <= limits.readyMaxS) {
    return { verdict: 'ready', short: `within ${fmt(limits.readyMaxS, 0)} s`, reason: `Clogging index ${fmt(ci, 0)} s is within the ${fmt(limits.readyMaxS, 0)} s limit for membrane filtration.` };
  }
  if (ci <= limits.borderlineMaxS) {
    return {
      verdict: 'borderline',
      short: `above ${fmt(limits.readyMaxS, 0)} s`,
      reason: `Clogging index ${fmt(ci, 0)} s is above the ${fmt(limits.readyMaxS, 0)} s limit for membrane filtration but within ${fmt(limits.borderlineMaxS, 0)} s: expect trouble if the filter is undersized.`,
    };
  }
  return {
    verdict: 'not-ready',
    short: `above ${fmt(limits.borderlineMaxS, 0)} s`,
    reason: `Clogging index ${fmt(ci, 0)} s is above the ${fmt(limits.borderlineMaxS, 0)} s limit: the membrane will clog fast; prefilter or re-treat first.`,
  };
}

/**
 * Readiness verdict of a wine lot for membrane filtration.
 *
 * Criteria, each judged only when its data is present:
 * - turbidity against the style's limit and borderline margin;
 * - clogging index against the ready and borderline limits (with a note when the
 *   turbidity is above the range where the test is valid);
 * - Vmax: the safety factor v_max/plannedLPerM2 (needs both numbers).
 * The verdict is the worst of the criteria judged; 'unknown' when none can be judged.
 * Sources of the default thresholds: see {@link defaultReadinessThresholds}.
 *
 * @param lot        style and lab results of the lot
 * @param thresholds thresholds to use (validated with {@link readinessThresholdsSchema});
 *                   defaults to {@link defaultReadinessThresholds}
 * @throws RangeError for an unknown style, invalid numbers or invalid thresholds
 */
export function lotReadiness(
  lot: LotReadinessInput,
  thresholds: ReadinessThresholds = defaultReadinessThresholds,
): LotReadiness {
  if (!WINE_STYLES.includes(lot.style)) {
    throw new RangeError(`Unknown wine style "${String(lot.style)}": use white, rosé, red, sweet or sparkling.`);
  }
  const th = thresholds === defaultReadinessThresholds ? thresholds : parseThresholds(thresholds);
  if (lot.turbidityNtu !== undefined) requireNonNegative('turbidity', lot.turbidityNtu);
  if (lot.cloggingIndex !== undefined) requireFinite('clogging index', lot.cloggingIndex);
  if (lot.vmaxLPerM2 !== undefined) requirePositive('Vmax per area', lot.vmaxLPerM2);
  if (lot.plannedLPerM2 !== undefined) requirePositive('planned litres per m²', lot.plannedLPerM2);

  const verdicts: Exclude<ReadinessVerdict, 'unknown'>[] = [];
  const reasons: string[] = [];
  const styleName = STYLE_NAME[lot.style];

  if (lot.turbidityNtu !== undefined) {
    const t = th.turbidity[lot.style];
    const x = lot.turbidityNtu;
    const upper = t.limitNtu + t.borderlineMarginNtu;
    if (x <= t.limitNtu) {
      verdicts.push('ready');
      reasons.push(`Turbidity ${fmt(x)} NTU is within the ${fmt(t.limitNtu)} NTU limit for ${styleName} before membrane filtration.`);
    } else if (x <= upper) {
      verdicts.push('borderline');
      reasons.push(
        `Turbidity ${fmt(x)} NTU is above the ${fmt(t.limitNtu)} NTU limit for ${styleName} before membrane filtration, but within the borderline margin (up to ${fmt(upper)} NTU).`,
      );
    } else {
      verdicts.push('not-ready');
      reasons.push(`Turbidity ${fmt(x)} NTU is above the ${fmt(t.limitNtu)} NTU limit for ${styleName} before membrane filtration.`);
    }
  }

  if (lot.cloggingIndex !== undefined) {
    const ci = cloggingIndexVerdict(lot.cloggingIndex, th.cloggingIndex);
    verdicts.push(ci.verdict);
    reasons.push(ci.reason);
    if (lot.turbidityNtu !== undefined && lot.turbidityNtu >= th.cloggingIndexValidity.validBelowNtu) {
      reasons.push(
        `The clogging index is only meaningful below ${fmt(th.cloggingIndexValidity.validBelowNtu)} NTU; at ${fmt(lot.turbidityNtu)} NTU treat it with caution.`,
      );
    }
  } else if (lot.turbidityNtu !== undefined) {
    reasons.push('No clogging index yet: low turbidity does not show that the wine will filter, as colloids can still block the membrane.');
  }

  if (lot.vmaxLPerM2 !== undefined && lot.plannedLPerM2 !== undefined) {
    const v = th.vmax;
    const sf = lot.vmaxLPerM2 / lot.plannedLPerM2;
    const head = `Vmax ${fmt(lot.vmaxLPerM2, 0)} L/m² is ${fmt(Math.round(sf * 100) / 100)}× the planned ${fmt(lot.plannedLPerM2, 0)} L/m²`;
    if (sf >= v.readyMinSafetyFactor) {
      verdicts.push('ready');
      reasons.push(`${head}, at least the ${fmt(v.readyMinSafetyFactor)}× safety factor.`);
    } else if (sf >= v.borderlineMinSafetyFactor) {
      verdicts.push('borderline');
      reasons.push(`${head}, below the ${fmt(v.readyMinSafetyFactor)}× safety factor but above ${fmt(v.borderlineMinSafetyFactor)}×.`);
    } else {
      verdicts.push('not-ready');
      reasons.push(`${head}, below the ${fmt(v.borderlineMinSafetyFactor)}× minimum safety factor: add area or improve the wine first.`);
    }
  } else if (lot.vmaxLPerM2 !== undefined) {
    reasons.push(`Vmax ${fmt(lot.vmaxLPerM2, 0)} L/m² cannot be judged without the planned litres per m² of membrane.`);
  } else if (lot.plannedLPerM2 !== undefined) {
    reasons.push(`The planned ${fmt(lot.plannedLPerM2, 0)} L/m² cannot be judged without a Vmax disc test.`);
  }

  if (verdicts.length === 0) {
    return {
      verdict: 'unknown',
      reasons: reasons.length ? reasons : ['No turbidity, clogging index or Vmax result for this lot yet.'],
    };
  }
  const worst = verdicts.reduce((a, b) => (RANK[b] > RANK[a] ? b : a));
  return { verdict: worst, reasons };
}
