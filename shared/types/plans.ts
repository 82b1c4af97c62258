// Response DTOs of bottling-day plans (metric/SI values; the client converts for display).
import type { DayBlockKind, DayStepsMin, PastRunStageOutcome, TrainSizingResult, WineStyle } from '../engine';
import type { SizingCatalogueHousing, SizingCatalogueType } from '../adapters/plans';
import type { PlanSanitationKind, PlanStatus, TrainHoseInput } from '../schemas/plans';

export type PlanLineDto = { id: string; name: string; bottlesPerHour: number; bottleMl: number };

/** One row of the plans list. */
export type PlanListItemDto = {
  id: string;
  name: string;
  /** YYYY-MM-DD */
  plannedDate: string;
  status: PlanStatus;
  line: { id: string; name: string } | null;
  lotCount: number;
  /** Sum of the volumes to bottle, L. */
  volumeL: number;
  createdAt: string;
  updatedAt: string;
  /** 1 for a new plan; a plan reopened after a run continues as revision + 1. */
  revision: number;
  archivedAt: string | null;
};

export type PlanTrainStageDto = {
  name?: string;
  cartridgeTypeId: string;
  housingId: string;
  housingCount: number;
  /** L/m² to terminal ΔP, or null when unknown. */
  capacityLPerM2: number | null;
};

/** One train option of a lot, with the engine's sizing of it (authoritative, from the server). */
export type PlanTrainDto = {
  id: string;
  name: string;
  stages: PlanTrainStageDto[];
  hoses: TrainHoseInput[] | null;
  /** The engine's sizing, or null when the train cannot be sized (see sizingError). */
  sizing: TrainSizingResult | null;
  sizingError: string | null;
  /** Why this train may not be approved (empty when it may). */
  blockingReasons: string[];
  createdAt: string;
  updatedAt: string;
};

export type PlanLotDto = {
  id: string;
  position: number;
  /** Volume to bottle, L. */
  volumeL: number;
  chosenTrainId: string | null;
  lot: {
    id: string;
    code: string;
    name: string;
    style: WineStyle;
    /** The lot's whole volume in the cellar, L. */
    volumeL: number;
    tempC: number;
    ethanolPctVol: number;
    sugarGPerL: number;
    /** v_max of the latest Vmax disc test, L/m², or null; membrane stages without a typed capacity take theirs from it. */
    vmaxLPerM2: number | null;
    /** Clogging index (s) and turbidity (NTU) of the latest lab result, or null: how similar past runs are picked. */
    cloggingIndexS: number | null;
    turbidityNtu: number | null;
    /**
     * The winery's closed runs of wines of this style, stage by stage (L/m² each reached): a stage
     * with nothing typed and no Vmax test takes its capacity from the similar ones.
     */
    pastRuns: PastRunStageOutcome[];
  };
  trains: PlanTrainDto[];
};

export type PlanTimelineBlockDto = {
  kind: DayBlockKind;
  label: string;
  startMs: number;
  endMs: number;
  /** HH:MM on the plan's clock. */
  start: string;
  end: string;
  /** Days after the planned date the block starts (0 the same day). */
  startDayOffset: number;
  minutes: number;
  planLotId?: string;
};

export type PlanTimelineDto = {
  blocks: PlanTimelineBlockDto[];
  totalMin: number;
  runMin: number;
  nonRunMin: number;
  end: string;
  endDayOffset: number;
  steps: DayStepsMin;
  /** Lots on the timeline without a chosen train run at the line's flow. */
  note: string | null;
};

/** What the chosen trains need of one cartridge type and length, against what the winery has. */
export type PlanNeedDto = {
  cartridgeTypeId: string;
  typeName: string;
  kind: 'prefilter' | 'membrane';
  ratingUm: number;
  lengthIn: number;
  /** New cartridges the chosen trains need over the day (a set carries over between lots of the same train). */
  cartridgesNeeded: number;
  elementEquivalentsNeeded: number;
  /** Usable cartridges in stock plus installed (not spent, latest integrity test not failed). */
  cartridgesAvailable: number;
  /** Cartridges of this type and length held but not usable (spent, failed test, being regenerated). */
  notUsable: number;
  inStock: number;
  installed: number;
  elementEquivalentsAvailable: number;
  /** Cartridges to order (0 when there are enough). */
  shortfall: number;
  verdict: 'enough' | 'short';
  /** Lots whose chosen train uses this type and length. */
  lotCodes: string[];
};

export type PlanDto = {
  id: string;
  name: string;
  plannedDate: string;
  status: PlanStatus;
  startTime: string;
  sanitationKind: PlanSanitationKind;
  notes: string;
  line: PlanLineDto | null;
  /** Flow the line asks of the filters with the default margin, L/h (null without a line). */
  requiredFlowLh: number | null;
  approvedBy: string | null;
  approvedAt: string | null;
  /** Cautions accepted at approval with the approver's written reason, or null. */
  approvalOverride: { cautions: string[]; reason: string } | null;
  createdBy: string | null;
  createdAt: string;
  updatedAt: string;
  revision: number;
  /** The approved plan this revision continues, kept as recorded. */
  previousPlanId: string | null;
  archivedAt: string | null;
  lots: PlanLotDto[];
  timeline: PlanTimelineDto | null;
  timelineError: string | null;
  needs: PlanNeedDto[];
  /** What would stop approval now (empty when the plan may be approved). */
  approvalBlockers: string[];
  /** The winery's catalogue, for sizing in the browser while editing. */
  catalogue: { cartridgeTypes: SizingCatalogueType[]; housings: SizingCatalogueHousing[] };
};
