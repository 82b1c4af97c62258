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

export type RunReadingDto = {
  id: string;
  clientKey: string;
  stageIndex: number;
  at: string;
  volumeL: number;
  upstreamBar: number;
  downstreamBar: number;
  dpBar: number;
  flowLh: number | null;
  tempC: number | null;
  /** Who logged it (their name), when known. */
  byName: string | null;
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
  readings: RunReadingDto[];
  /** The best physically valid fit; null with a reason in `note` when there is none yet. */
  fit: ConstantFlowFit | null;
  /** Fitted ΔP along the readings' volumes up to terminal, for the chart. */
  curve: { volumeL: number; dpBar: number }[];
  forecast: RunForecast | null;
  alarm: RunAlarm | null;
  flowLh: number | null;
  note: string | null;
};

export type RunDetailDto = RunSummaryDto & {
  notes: string;
  trainName: string;
  lineName: string | null;
  requiredFlowLh: number | null;
  volumeToBottleL: number;
  stages: RunStageDto[];
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
