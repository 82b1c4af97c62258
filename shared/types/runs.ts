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
};

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
  /** "ΔP not rising: possible bypass or gauge fault." when litres rise over 5+ readings and ΔP does not; else null */
  flatWarning: string | null;
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
