// The "Today" landing page: what needs a look this morning (metric/SI values; the client converts).
import type { BudgetFactor, LimitingFactor, ReadinessVerdict, WineStyle } from '../engine';
import type { CartridgeStatus } from '../schemas/cartridges';
import type { PlanStatus } from '../schemas/plans';
import type { CartridgeStockRowDto } from './cartridges';
import type { RunInProgressDto } from './runs';

/** A lot that is not ready, borderline, or has no verdict yet. */
export type TodayLotDto = {
  id: string;
  code: string;
  name: string;
  style: WineStyle;
  /** L */
  volumeL: number;
  verdict: ReadinessVerdict;
  /** The reason that explains the verdict (the first one that is not a pass). */
  reason: string;
  /** When the latest lab result was sampled, or null when there is none. */
  sampledAt: string | null;
};

/** What makes a cartridge worth a look, with the figure behind it. */
export type TodayCartridgeFigure =
  /** The latest integrity test failed (at = when it was made). */
  | { kind: 'integrity-failed'; at: string }
  /** The life forecast has ended for another reason (a budget used up, flow no longer recovers). */
  | { kind: 'life-ended'; because: string }
  /** Few care cycles left before the first limit. */
  | { kind: 'cycles-left'; cyclesLeft: number; factor: LimitingFactor }
  /** A rated budget mostly used. */
  | { kind: 'budget-used'; factor: BudgetFactor; used: number; rated: number; fraction: number }
  /** Flow recovered close to the type's floor. */
  | { kind: 'flow-recovery'; latestPct: number; minPct: number };

export type TodayCartridgeDto = {
  id: string;
  serial: string;
  typeName: string;
  status: CartridgeStatus;
  housing: { id: string; name: string } | null;
  position: number | null;
  /** Plain words, e.g. "Latest integrity test failed". */
  reason: string;
  figure: TodayCartridgeFigure;
  /** Further reasons of lower urgency, in plain words. */
  alsoNoted: string[];
};

/** A type's stock as the cartridges page counts it (without the retired), and whether the shelf is empty. */
export type TodayStockTypeDto = Omit<CartridgeStockRowDto, 'retired'> & {
  /** Nothing of this type on the shelf. */
  shortfall: boolean;
};

/** A cartridge type and length the plan's chosen trains need more of than the winery has. */
export type TodayPlanShortfallDto = {
  cartridgeTypeId: string;
  typeName: string;
  kind: 'prefilter' | 'membrane';
  lengthIn: number;
  /** Cartridges to find or order: needed minus in stock and installed. */
  short: number;
};

/** A bottling day still ahead (draft or approved, planned today or later). */
export type TodayPlanDto = {
  id: string;
  name: string;
  /** YYYY-MM-DD */
  plannedDate: string;
  status: Exclude<PlanStatus, 'done'>;
  line: { id: string; name: string } | null;
  lotCount: number;
  /** Sum of the volumes to bottle, L. */
  volumeL: number;
  /** Every lot has a chosen train (false when the plan has no lots yet). */
  trainsChosen: boolean;
  /** Lots still without a chosen train. */
  lotsWithoutTrain: number;
  /** From the plan's cartridges needed; empty when the stock covers the chosen trains. */
  shortfalls: TodayPlanShortfallDto[];
};

export type TodayDto = {
  counts: {
    lots: number;
    tanks: number;
    housings: number;
    /** housings with at least one empty round */
    housingsWithFreeRounds: number;
    cartridgeTypes: number;
    /** cartridges not retired */
    cartridges: number;
    cartridgesInstalled: number;
  };
  lots: {
    byVerdict: Record<ReadinessVerdict, number>;
    /** Most urgent first, at most 8. */
    attention: TodayLotDto[];
    /** All lots that need attention (attention may be cut short). */
    attentionTotal: number;
  };
  cartridges: {
    /** Most urgent first, at most 10. */
    attention: TodayCartridgeDto[];
    attentionTotal: number;
  };
  stock: {
    types: TodayStockTypeDto[];
    shortfalls: number;
  };
  /** Draft and approved plans dated today or later, soonest first, at most 5. */
  upcomingPlans: TodayPlanDto[];
  /** Runs in progress, oldest first, each stage with its forecast and alarm (at most 20). */
  runsInProgress: RunInProgressDto[];
};
