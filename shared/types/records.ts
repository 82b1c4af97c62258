// Response DTOs of the bottling filtration record (issue 9, section 4). Metric/SI values; the
// client converts for display. Everything inside `RecordContent` is hashed for the fingerprint;
// `fingerprint` and `generatedAt` sit outside it.
import type { BlockingLaw, ReadinessVerdict, WineStyle } from '../engine';
import type { CycleKind, IntegrityTestKind } from '../schemas/care';

/** A lab result as it stood when the run started (the latest sampled at or before the start). */
export type RecordAnalysesDto = {
  sampledAt: string;
  turbidityNtu: number | null;
  /** T400 − 2·T200, s */
  cloggingIndex: number | null;
  /** Vmax per m² of the disc test, L/m² (null when not computable or not measured) */
  vmaxLPerM2: number | null;
};

/** The readiness thresholds a verdict was judged against, for the lot's style (as the lot page shows them). */
export type RecordReadinessThresholdsDto = {
  /** The engine's defaults (true) or the winery's own. */
  isDefault: boolean;
  turbidity: { limitNtu: number; borderlineMarginNtu: number; source: string };
  cloggingIndex: { readyMaxS: number; borderlineMaxS: number; source: string };
  cloggingIndexValidity: { validBelowNtu: number; source: string };
  vmax: { readyMinSafetyFactor: number; borderlineMinSafetyFactor: number; source: string };
};

/**
 * Readiness of the lot when the run started. 'frozen-at-start': the verdict, reasons,
 * thresholds and analyses kept on the run when it started (later changes to the thresholds or
 * lab results do not touch them). 'current-thresholds': a run started before readiness was kept
 * with the run, judged now with the winery's current thresholds (`note` says so).
 */
export type RecordReadinessDto = {
  verdict: ReadinessVerdict;
  reasons: string[];
  source: 'frozen-at-start' | 'current-thresholds';
  thresholds: RecordReadinessThresholdsDto;
  /** Words for the reader when the verdict was not kept at the start (null when it was). */
  note: string | null;
};

/** What a run keeps of the lot's readiness when it starts (stored on the run, never changed). */
export type RunReadinessAtStart = {
  verdict: ReadinessVerdict;
  reasons: string[];
  thresholds: RecordReadinessThresholdsDto;
  /** The lab result judged (the latest sampled at or before the start), as it was then. */
  analyses: RecordAnalysesDto | null;
  labResultId: string | null;
};

/** One stage of the chosen train as sized when the plan was approved. */
export type RecordSizedStageDto = {
  index: number;
  name: string;
  kind: 'prefilter' | 'membrane';
  ratingUm: number;
  cartridgeCount: number;
  elementEquivalents: number;
  areaM2: number;
  fluxLmh: number;
  cleanDpBar: number;
  terminalDpBar: number;
  /** L to terminal ΔP for one set, or null when unknown */
  capacityL: number | null;
  setsUsed: number;
};

export type RecordSizingDto = {
  flowLh: number;
  batchL: number;
  runHours: number;
  pumpPressureCleanBar: number;
  pumpPressureEndOfRunBar: number;
  stages: RecordSizedStageDto[];
  warnings: string[];
};

export type RecordPlanDto = {
  id: string;
  name: string;
  plannedDate: string;
  trainName: string;
  lineName: string | null;
  bottleMl: number | null;
  approvedAt: string | null;
  approvedByName: string | null;
  /**
   * Where the sized figures come from: 'frozen-at-approval' (plans approved since plans keep their sizing), 'stored-train'
   * while they are sized from the stored train (the train cannot change after approval).
   */
  sizingSource: 'frozen-at-approval' | 'stored-train';
  sizing: RecordSizingDto | null;
  /** Why there are no sized figures (null when there are). */
  sizingNote: string | null;
};

export type RecordCyclesDto = { steam: number; hotWater: number; chemical: number };

export type RecordCartridgeDto = {
  cartridgeId: string;
  serial: string;
  batch: string;
  typeName: string;
  kind: 'prefilter' | 'membrane';
  ratingUm: number;
  lengthIn: number;
  /** Litres through the train while it was in, L (null while the run is open). */
  litresCarried: number | null;
  /** Litres filtered in its life before this run, L */
  litresAtStart: number;
  cyclesAtStart: RecordCyclesDto;
  /** Litres through the train when it went in (0 for those in at the start). */
  installedAtVolumeL: number;
  /** Litres through the train when it came out (null: in until the end). */
  removedAtVolumeL: number | null;
};

export type RecordChangeDto = {
  kind: 'change' | 'regeneration';
  atVolumeL: number;
  removedSerials: string[];
  installedSerials: string[];
  byName: string | null;
  at: string;
};

export type RecordSanitationDto = {
  serial: string;
  kind: CycleKind;
  tempC: number | null;
  durationMin: number | null;
  agent: string | null;
  byName: string | null;
  at: string;
};

export type RecordIntegrityTestDto = {
  serial: string;
  test: IntegrityTestKind;
  /** The value read: bar for bubble point, mL/min for diffusion, mbar for pressure hold. */
  measured: number | null;
  /** The limit it was judged against, same unit. */
  limit: number | null;
  /** 'min' (bubble point) or 'max' (diffusion, decay). */
  limitKind: 'min' | 'max';
  unit: 'bar' | 'mL/min' | 'mbar';
  pass: boolean;
  byName: string | null;
  at: string;
};

export type RecordIntegrityDto = {
  /** The latest test of each membrane cartridge at or before the start. */
  before: RecordIntegrityTestDto[];
  /** The first test of each membrane cartridge after the last reading (closed runs only). */
  after: RecordIntegrityTestDto[];
  /** 'proven': every membrane cartridge passed before and after; otherwise a warning. */
  status: 'proven' | 'warning';
  /** The plain statement: volume and bottles between two passing tests, or what is missing. */
  statement: string;
};

export type RecordCorrectionDto = {
  kind: 'correct' | 'void';
  volumeL: number | null;
  upstreamBar: number | null;
  downstreamBar: number | null;
  flowLh: number | null;
  tempC: number | null;
  reason: string;
  byName: string | null;
  at: string;
};

export type RecordReadingDto = {
  id: string;
  at: string;
  volumeL: number;
  upstreamBar: number;
  downstreamBar: number;
  dpBar: number;
  flowLh: number | null;
  tempC: number | null;
  byName: string | null;
  /** Corrections in order; the latest wins. The original values above are never changed. */
  corrections: RecordCorrectionDto[];
  voided: boolean;
};

export type RecordFitDto = {
  law: BlockingLaw;
  dp0Bar: number;
  kPerL: number;
  r2: number;
  n: number;
};

export type RecordStageDto = {
  index: number;
  name: string;
  housingName: string;
  kind: 'prefilter' | 'membrane';
  plannedTypeName: string;
  terminalDpBar: number;
  cartridges: RecordCartridgeDto[];
  changes: RecordChangeDto[];
  sanitation: RecordSanitationDto[];
  /** Null for prefilter stages (no integrity test applies). */
  integrity: RecordIntegrityDto | null;
  readings: RecordReadingDto[];
  fit: RecordFitDto | null;
  /** Fitted ΔP against litres, for the chart. */
  curve: { volumeL: number; dpBar: number }[];
  /** Last ΔP measured on the stage (after corrections), bar; null without readings. */
  finalDpBar: number | null;
  /** Why there is no fit (null when there is one). */
  fitNote: string | null;
};

export type RecordRunDto = {
  id: string;
  status: 'running' | 'closed';
  startedAt: string;
  startedByName: string | null;
  closedAt: string | null;
  closedByName: string | null;
  /** Litres through the train (largest reading volume, after corrections). */
  volumeFilteredL: number;
  /** Bottles that volume fills at the plan line's bottle size (null without a line). */
  bottles: number | null;
  analyses: RecordAnalysesDto | null;
  readiness: RecordReadinessDto;
  plan: RecordPlanDto;
  overrideReason: string | null;
  overrideByName: string | null;
  stages: RecordStageDto[];
  notes: string;
};

export type RecordLotDto = {
  id: string;
  code: string;
  name: string;
  style: WineStyle;
  vintage: number | null;
  volumeL: number;
};

/** What the fingerprint covers. */
export type RecordContent = {
  /** Version of the record's shape, so a fingerprint can be re-checked by the same rules (2: readiness as judged at the run's start, with its thresholds). */
  schemaVersion: 2;
  lot: RecordLotDto;
  runs: RecordRunDto[];
};

export type FilterRecordDto = RecordContent & {
  /** SHA-256 (hex) of the canonical JSON of the content (sorted keys, no spaces). */
  fingerprint: string;
  /** When this copy was made; not hashed (it differs on every copy of the same record). */
  generatedAt: string;
};

/** One row of the bottled-lots list. */
export type RecordLotListItemDto = {
  lotId: string;
  code: string;
  name: string;
  style: WineStyle;
  volumeL: number;
  runCount: number;
  /** Litres through the trains of the lot's closed runs. */
  volumeFilteredL: number;
  lastBottledAt: string;
  planNames: string[];
};

export type RecordLotListDto = { items: RecordLotListItemDto[]; total: number };

/** The answer of `POST /api/records/verify`: does the fingerprint match the record as it stands now? */
export type VerifyRecordDto = { matches: boolean };
