import type { DayTimeline } from '../../../shared/engine';
import type { SizingCatalogueHousing, SizingCatalogueType, TrainSizingOutcome } from '../../../shared/adapters/plans';
import { planClock } from '../../../shared/schemas/plans';
import type {
  PlanDto,
  PlanListItemDto,
  PlanLotDto,
  PlanNeedDto,
  PlanTimelineDto,
  PlanTrainDto,
} from '../../../shared/types/plans';
import type { PlanLineRow, PlanLotRow, PlanRow, PlanTrainRow } from './plans.repository';

const iso = (d: Date) => d.toISOString();
const DAY_MS = 86_400_000;

export const presentPlanListItem = (r: { plan: PlanRow; lineName: string | null; lotCount: number; volumeL: number }): PlanListItemDto => ({
  id: r.plan.id,
  name: r.plan.name,
  plannedDate: r.plan.plannedDate,
  status: r.plan.status,
  line: r.plan.lineId && r.lineName !== null ? { id: r.plan.lineId, name: r.lineName } : null,
  lotCount: Number(r.lotCount),
  volumeL: Number(r.volumeL),
  createdAt: iso(r.plan.createdAt),
  updatedAt: iso(r.plan.updatedAt),
  revision: r.plan.revision,
  archivedAt: r.plan.archivedAt ? iso(r.plan.archivedAt) : null,
});

export const presentTrain = (t: PlanTrainRow, outcome: TrainSizingOutcome, blockingReasons: string[]): PlanTrainDto => ({
  id: t.id,
  name: t.name,
  stages: t.stages.map((s) => ({
    ...(s.name ? { name: s.name } : {}),
    cartridgeTypeId: s.cartridgeTypeId,
    housingId: s.housingId,
    housingCount: s.housingCount,
    capacityLPerM2: s.capacityLPerM2 ?? null,
  })),
  hoses: t.hoses ?? null,
  sizing: outcome.ok ? outcome.result : null,
  sizingError: outcome.ok ? null : outcome.error,
  blockingReasons,
  createdAt: iso(t.createdAt),
  updatedAt: iso(t.updatedAt),
});

export const presentPlanLot = (pl: PlanLotRow, lot: PlanLotDto['lot'], trains: PlanTrainDto[]): PlanLotDto => ({
  id: pl.id,
  position: pl.position,
  volumeL: pl.volumeL,
  chosenTrainId: pl.chosenTrainId,
  lot,
  trains,
});

/** The engine's day timeline with wall-clock times on the plan's own clock. */
export function presentTimeline(t: DayTimeline, plannedDate: string, note: string | null): PlanTimelineDto {
  const dayStart = Date.parse(`${plannedDate}T00:00:00Z`);
  const offset = (ms: number) => Math.floor((ms - dayStart) / DAY_MS);
  return {
    blocks: t.blocks.map((b) => ({
      kind: b.kind,
      label: b.label,
      startMs: b.startMs,
      endMs: b.endMs,
      start: planClock(b.startMs),
      end: planClock(b.endMs),
      startDayOffset: offset(b.startMs),
      minutes: (b.endMs - b.startMs) / 60_000,
      ...(b.lotId ? { planLotId: b.lotId } : {}),
    })),
    totalMin: t.totals.totalMin,
    runMin: t.totals.runMin,
    nonRunMin: t.totals.nonRunMin,
    end: planClock(t.totals.endMs),
    endDayOffset: offset(t.totals.endMs),
    steps: t.steps,
    note,
  };
}

export const presentPlan = (p: {
  plan: PlanRow;
  line: PlanLineRow | null;
  approverName: string | null;
  creatorName: string | null;
  requiredFlowLh: number | null;
  lots: PlanLotDto[];
  timeline: PlanTimelineDto | null;
  timelineError: string | null;
  needs: PlanNeedDto[];
  approvalBlockers: string[];
  types: SizingCatalogueType[];
  housings: SizingCatalogueHousing[];
}): PlanDto => ({
  id: p.plan.id,
  name: p.plan.name,
  plannedDate: p.plan.plannedDate,
  status: p.plan.status,
  startTime: p.plan.startTime,
  sanitationKind: p.plan.sanitationKind,
  notes: p.plan.notes,
  line: p.line ? { id: p.line.id, name: p.line.name, bottlesPerHour: p.line.bottlesPerHour, bottleMl: p.line.bottleMl } : null,
  requiredFlowLh: p.requiredFlowLh,
  approvedBy: p.approverName,
  approvedAt: p.plan.approvedAt ? iso(p.plan.approvedAt) : null,
  approvalOverride: p.plan.approvalReason ? { cautions: p.plan.approvalCautions ?? [], reason: p.plan.approvalReason } : null,
  createdBy: p.creatorName,
  createdAt: iso(p.plan.createdAt),
  updatedAt: iso(p.plan.updatedAt),
  revision: p.plan.revision,
  previousPlanId: p.plan.previousPlanId,
  archivedAt: p.plan.archivedAt ? iso(p.plan.archivedAt) : null,
  lots: p.lots,
  timeline: p.timeline,
  timelineError: p.timelineError,
  needs: p.needs,
  approvalBlockers: p.approvalBlockers,
  catalogue: { cartridgeTypes: p.types, housings: p.housings },
});
