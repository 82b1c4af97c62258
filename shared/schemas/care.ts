import { z } from 'zod';
import { yearInRange, yearRangeMessage } from './common';

export const CYCLE_KINDS = ['hot-water', 'steam', 'chemical', 'backflush'] as const;
export type CycleKind = (typeof CYCLE_KINDS)[number];
export const cycleKindLabels: Record<CycleKind, string> = {
  'hot-water': 'Hot water',
  steam: 'Steam',
  chemical: 'Chemical clean',
  backflush: 'Backflush',
};

export const INTEGRITY_TESTS = ['bubble-point', 'diffusion', 'pressure-hold'] as const;
export type IntegrityTestKind = (typeof INTEGRITY_TESTS)[number];
export const integrityTestLabels: Record<IntegrityTestKind, string> = {
  'bubble-point': 'Bubble point',
  diffusion: 'Diffusion',
  'pressure-hold': 'Pressure hold',
};

export const WETTING_FLUIDS = ['water', 'wine', 'ethanol-water'] as const;
export type WettingFluid = (typeof WETTING_FLUIDS)[number];
export const wettingFluidLabels: Record<WettingFluid, string> = { water: 'Water', wine: 'Wine', 'ethanol-water': 'Ethanol–water' };
export const AGENT_MAX = 120;
export const FLOW_BASES = ['cartridge', 'housing'] as const;
export type FlowBasis = (typeof FLOW_BASES)[number];
export const CARE_NOTES_MAX = 2000;
/** Highest ΔP of a clean-water flow measurement, bar (above a cartridge's forward rating). */
export const FLOW_DP_MAX_BAR = 10;

/** A number that may be left out; null or absent means "not measured". */
const optionalNum = (what: string) => z.number({ error: `Enter ${what} as a number, or leave it empty.` });
/** When it was done: ISO date-time with offset, not in the future (a minute of clock drift allowed). */
const atSchema = z.iso
  .datetime({ offset: true, error: 'Enter when it was done as a date and time.' })
  .refine(yearInRange, { error: yearRangeMessage })
  .refine((v) => Date.parse(v) <= Date.now() + 60_000, { error: 'The time cannot be in the future.' })
  .optional();

const flow = (what: string) =>
  optionalNum(what).min(0, { error: 'Water flow cannot be negative.' }).max(1_000_000, { error: 'That water flow is too large.' }).nullable().optional();

export const logCycleInputSchema = z
  .object({
    kind: z.enum(CYCLE_KINDS, { error: 'Choose hot water, steam, chemical clean or backflush.' }),
    tempC: optionalNum('the temperature').min(0, { error: 'The temperature is at least 0 °C.' }).max(200, { error: 'The temperature is at most 200 °C.' }).nullable().optional(),
    durationMin: optionalNum('the duration').min(0, { error: 'The duration cannot be negative.' }).max(24 * 60, { error: 'A cycle lasts at most a day (1,440 min).' }).nullable().optional(),
    agent: z.string().trim().max(AGENT_MAX, { error: `The agent is at most ${AGENT_MAX} characters.` }).optional(),
    concentrationPct: optionalNum('the concentration').min(0, { error: 'The concentration cannot be negative.' }).max(100, { error: 'The concentration is at most 100 %.' }).nullable().optional(),
    waterFlowBeforeLh: flow('the water flow before'),
    waterFlowAfterLh: flow('the water flow after'),
    /** Temperature of the water the flows were measured with, °C (flows are brought to 20 °C). */
    waterTempC: optionalNum('the water temperature').min(0, { error: 'The water temperature is at least 0 °C.' }).max(100, { error: 'The water temperature is at most 100 °C.' }).nullable().optional(),
    /**
     * ΔP across the cartridge while the water flows were measured, bar. Left out, the type's
     * clean-water specification ΔP is assumed; flows are brought to that reference ΔP (Q ∝ ΔP).
     */
    flowDpBar: optionalNum('the ΔP of the flow measurement')
      .positive({ error: 'The ΔP of the flow measurement must be more than 0.' })
      .max(FLOW_DP_MAX_BAR, { error: `The ΔP of the flow measurement is at most ${FLOW_DP_MAX_BAR} bar.` })
      .nullable()
      .optional(),
    /** Whether the flows are this cartridge's alone or the whole housing's. */
    flowBasis: z.enum(FLOW_BASES, { error: 'Choose this cartridge or the whole housing.' }).optional(),
    /** Set when the cycle really ran above the cartridge's or housing's rating: it is recorded and flagged. */
    aboveRatingConfirmed: z.boolean({ error: 'Confirm with yes or no.' }).optional(),
    at: atSchema,
  })
  .superRefine((v, ctx) => {
    if (v.kind === 'chemical' && !v.agent) ctx.addIssue({ code: 'custom', path: ['agent'], message: 'Name the cleaning agent, e.g. caustic soda or citric acid.' });
  });
export type LogCycleInput = z.infer<typeof logCycleInputSchema>;

export const recordIntegrityInputSchema = z
  .object({
    test: z.enum(INTEGRITY_TESTS, { error: 'Choose bubble point, diffusion or pressure hold.' }),
    bubblePointBar: optionalNum('the bubble point').min(0, { error: 'The bubble point cannot be negative.' }).max(20, { error: 'The bubble point is at most 20 bar.' }).nullable().optional(),
    diffusionMlMin: optionalNum('the diffusion flow').min(0, { error: 'The diffusion flow cannot be negative.' }).max(100_000, { error: 'That diffusion flow is too large.' }).nullable().optional(),
    decayMbar: optionalNum('the pressure decay').min(0, { error: 'The pressure decay cannot be negative.' }).max(20_000, { error: 'The pressure decay is at most 20,000 mbar.' }).nullable().optional(),
    testMin: optionalNum('the test time').positive({ error: 'The test time must be more than 0 min.' }).max(240, { error: 'A test lasts at most 240 min.' }).nullable().optional(),
    tempC: optionalNum('the temperature').min(0, { error: 'The temperature is at least 0 °C.' }).max(100, { error: 'The temperature is at most 100 °C.' }).nullable().optional(),
    wettingFluid: z.enum(WETTING_FLUIDS, { error: 'Choose water, wine or ethanol–water.' }).optional(),
    /** Alcoholic strength of the wetting wine or ethanol–water, % vol. */
    ethanolPctVol: optionalNum('the alcoholic strength').min(0, { error: 'The strength is at least 0 % vol.' }).max(100, { error: 'The strength is at most 100 % vol.' }).nullable().optional(),
    notes: z.string().trim().max(CARE_NOTES_MAX, { error: `Notes are at most ${CARE_NOTES_MAX} characters.` }).optional(),
    at: atSchema,
  })
  .superRefine((v, ctx) => {
    const need = (field: 'bubblePointBar' | 'diffusionMlMin' | 'decayMbar' | 'testMin', message: string) => {
      if (v[field] === undefined || v[field] === null) ctx.addIssue({ code: 'custom', path: [field], message });
    };
    if (v.test === 'bubble-point') need('bubblePointBar', 'Enter the bubble point you read.');
    if (v.test === 'bubble-point' && (v.wettingFluid === 'wine' || v.wettingFluid === 'ethanol-water') && (v.ethanolPctVol === undefined || v.ethanolPctVol === null)) {
      ctx.addIssue({ code: 'custom', path: ['ethanolPctVol'], message: 'Enter the alcoholic strength of the wetting liquid, % vol: its surface tension sets the expected bubble point.' });
    }
    if (v.test === 'diffusion') need('diffusionMlMin', 'Enter the diffusion flow you measured.');
    if (v.test === 'pressure-hold') {
      need('decayMbar', 'Enter the pressure decay you read.');
      need('testMin', 'Enter how long the hold lasted.');
    }
  });
export type RecordIntegrityInput = z.infer<typeof recordIntegrityInputSchema>;
