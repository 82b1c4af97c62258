import type { ConstantFlowFit, RunAlarm, RunForecast } from '../engine';

export type RunStatus = 'running' | 'closed';

export type RunSummaryDto = {
  id: string;
  status: RunStatus;
  planId: string;
  planName: string;
  planLotId: string;
  lotId: string;
  lotCode: string;
  lotName: string;
  volumeL: number;
  startedAt: string;
  closedAt: string | null;
  currentVolumeL: number;
  readingCount: number;
};

/** A reading's values as logged, in stored units (bar, L, L/h, °C); `at` is an ISO time. */
export type ReadingValuesDto = {
  at: string;
  volumeL: number;
  upstreamBar: number;
  downstreamBar: number;
  dpBar: number;
  flowLh: number | null;
  tempC: number | null;
};

export type RunReadingDto = {
  id: string;
  clientKey: string;
  stageIndex: number;
} & ReadingValuesDto & {
  /** Who logged it, as named at the time. */
  createdByName: string | null;
  /** Who logged it: the name at the time, else the person's current name. */
  byName: string | null;
  /** The values as first logged, when a correction changed them; null otherwise. */
  original: { volumeL: number; upstreamBar: number; downstreamBar: number; flowLh: number | null; tempC: number | null } | null;
  /** Every correction and void, oldest first; the latest wins. */
  corrections: RunReadingCorrectionDto[];
  /** True when the latest correction voided it: it is kept but left out of fits. */
  voided: boolean;
};

export type RunReadingCorrectionDto = {
  id: string;
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

/** One cartridge's stint in a stage of a run, as snapshotted at start or at a change. */
export type RunStageCartridgeDto = {
  id: string;
  cartridgeId: string;
  serial: string;
  batch: string | null;
  typeId: string;
  typeName: string;
  ratingUm: number;
  lengthIn: number | null;
  housingId: string;
  housingName: string;
  litresAtStart: number;
  cyclesAtStart: number;
  installedAtVolumeL: number;
  removedAtVolumeL: number | null;
  /** Litres through the train while it was in; set when the run closes. */
  litresCarried: number | null;
};

export type RunChangeDto = {
  id: string;
  stageIndex: number;
  kind: 'change' | 'regeneration';
  atVolumeL: number;
  removedSerials: string[];
  installedSerials: string[];
  byName: string | null;
  at: string;
};

/**
 * The answer to one logged reading: the stored reading and, when asked for with
 * `?with=stage`, its stage's new figures and the run's totals, so the phone updates what it
 * shows without loading the whole run again.
 */
export type LoggedReadingDto = RunReadingDto & {
  stage?: RunStageDto;
  run?: Pick<RunDetailDto, 'currentVolumeL' | 'readingCount' | 'volumeToBottleL'>;
};

/** The answer to a batch of readings: how many were new, how many were already stored. */
export type ReadingsBatchResultDto = { stored: number; duplicates: number };

export type RunStageDto = {
  index: number;
  name: string;
  cartridgeTypeId: string;
  cartridgeTypeName: string;
  housingId: string;
  housingName: string;
  terminalDpBar: number;
  /**
   * The stage's readings thinned for the chart (at most `chartPointsPerStage` of the run, plus every corrected
   * or voided one; the first and the last always), in litre order. The fit, the forecast and the
   * final figures are computed on the server from all readings; the table pages them through
   * `GET /api/runs/:id/readings`.
   */
  readings: RunReadingDto[];
  /** How many readings the stage has in all (voided ones included). */
  readingCount: number;
  /** The best physically valid fit; null with a reason in `note` when there is none yet. */
  /** (Without the per-reading residuals, which would grow with the readings.) */
  fit: Omit<ConstantFlowFit, 'residuals'> | null;
  /** Fitted ΔP along the readings' volumes up to terminal, for the chart. */
  curve: { volumeL: number; dpBar: number }[];
  forecast: RunForecast | null;
  alarm: RunAlarm | null;
  flowLh: number | null;
  note: string | null;
  /** Every cartridge that was in this stage during the run (in now, and changed out). */
  cartridges: RunStageCartridgeDto[];
  /** "ΔP not rising: possible bypass or gauge fault." when litres rise over 5+ readings and ΔP does not; else null */
  flatWarning: string | null;
  /** A closed run's final figures for the stage (then `forecast` and `alarm` are null); null while running. */
  final: RunStageFinalDto | null;
};

/** What a stage did in a closed run: its record, not a forecast. */
export type RunStageFinalDto = {
  /** Litres through the stage in the run, L. */
  litresL: number;
  /** Litres through the stage's last set (since its last change or regeneration), L. */
  litresLastSetL: number;
  changes: number;
  regenerations: number;
  /** ΔP of the last counted reading, bar; null without readings. */
  lastDpBar: number | null;
  /** Highest ΔP the last set reached, bar; null without readings on it. */
  maxDpBar: number | null;
  /** True when the last set's ΔP reached the stage's terminal ΔP. */
  terminalReached: boolean;
};

export type RunDetailDto = RunSummaryDto & {
  notes: string;
  trainName: string;
  lineName: string | null;
  requiredFlowLh: number | null;
  volumeToBottleL: number;
  stages: RunStageDto[];
  startedByName: string | null;
  closedByName: string | null;
  override: { reason: string; byName: string | null; checks: { stageIndex: number; code: string; message: string }[] } | null;
  changes: RunChangeDto[];
};

/** One stage's physical state against the plan, for the start screen. */
export type RunStartCheckDto = {
  planLotId: string;
  stages: {
    index: number;
    name: string;
    housingId: string;
    housingName: string;
    rounds: number;
    housingCount: number;
    plannedTypeId: string;
    plannedTypeName: string;
    installed: { id: string; serial: string; typeId: string; typeName: string }[];
  }[];
  reasons: { stageIndex: number; code: string; message: string; overridable: boolean }[];
};

/** An approved plan's lot that a run can be started for. */
export type RunStartOptionDto = {
  planLotId: string;
  planId: string;
  planName: string;
  plannedDate: string;
  lotCode: string;
  lotName: string;
  volumeL: number;
  trainName: string;
  runningRunId: string | null;
};

/** One stage of a run in progress, as Today shows it: its latest ΔP, forecast and alarm. */
export type RunInProgressStageDto = {
  index: number;
  name: string;
  cartridgeTypeName: string;
  terminalDpBar: number;
  /** ΔP of the latest counted reading, bar, or null before the first reading. */
  dpBar: number | null;
  readingCount: number;
  /** The forecast's figures Today shows, or null with the reason in `note`. */
  forecast: Pick<RunForecast, 'volumeLeftL' | 'hoursLeft' | 'timeLeft' | 'reachedTerminal' | 'beyondReadings' | 'volumeSeenL'> | null;
  alarm: RunAlarm | null;
  note: string | null;
  flatWarning: string | null;
};

/** A run in progress with each stage's forecast and alarm (Today). */
export type RunInProgressDto = {
  id: string;
  startedAt: string;
  plan: { id: string; name: string; plannedDate: string };
  lot: { id: string; code: string; name: string };
  /** Litres of the lot to bottle in this run, and through the train so far, L. */
  volumeL: number;
  currentVolumeL: number;
  stages: RunInProgressStageDto[];
};
