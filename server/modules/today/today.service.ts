import type { CartridgeLifeVerdict, ReadinessVerdict } from '../../../shared/engine';
import type { LotsListQuery } from '../../../shared/schemas/cellar';
import type { LotListItemDto } from '../../../shared/types/cellar';
import type { TodayCartridgeFigure, TodayDto, TodayPlanDto } from '../../../shared/types/today';
import type { Database } from '../../db/client';
import type { TenantContext } from '../../middleware/authorize';
import { createCartridgesService, lifeVerdictFromHistory } from '../cartridges/cartridges.service';
import { createLifeInputsService } from '../cartridges/life-inputs.service';
import { createCellarService } from '../cellar/cellar.service';
import { createPlansService } from '../plans/plans.service';
import { createRunsInProgressService } from '../runs/runs-in-progress.service';
import { presentStockType, presentTodayCartridge, presentTodayLot, presentTodayPlan } from './today.presenter';
import { createTodayRepository } from './today.repository';

/** Lots shown on the page; the total is given beside them. */
export const TODAY_LOTS_MAX = 8;
/** Bottling days ahead shown on the page. */
export const TODAY_PLANS_MAX = 5;
/** Cartridges shown on the page. */
export const TODAY_CARTRIDGES_MAX = 10;
/** A cartridge with this many care cycles left, or fewer, is near the end of its life. */
export const CYCLES_LEFT_WATCH = 3;
/** A rated budget used to this fraction, or more, is worth a look. */
export const BUDGET_WATCH_FRACTION = 0.8;
/** Flow recovery within this many percentage points above the floor is near it. */
export const RECOVERY_MARGIN_PCT = 10;

/** A winery's whole cellar in one page of the lots listing (a cellar holds tens of lots, not thousands). */
const ALL_LOTS: LotsListQuery = { q: undefined, sort: 'code', order: 'asc', page: 1, pageSize: 5000 };

const verdictRank: Record<ReadinessVerdict, number> = { 'not-ready': 0, borderline: 1, unknown: 2, ready: 3 };

/** Reasons the engine gives for a criterion that passed; the lead reason is the first that did not. */
const PASSING_REASON = [/^Turbidity .* is within the .* limit/, /^Clogging index .* is within the .* limit/, /at least the .* safety factor\.$/];

function leadReason(lot: LotListItemDto): string {
  if (!lot.latest) return 'No lab result yet.';
  const reasons = lot.readiness.reasons;
  return reasons.find((r) => !PASSING_REASON.some((p) => p.test(r))) ?? reasons[0] ?? 'No verdict yet.';
}

type Finding = { rank: number; closeness: number; reason: string; figure: TodayCartridgeFigure };

const plural = (n: number, one: string, many: string) => (n === 1 ? one : many);
const round = (v: number) => Math.round(v * 10) / 10;

/** Short plain words for a finding that is not the lead one. */
function noteOf(figure: TodayCartridgeFigure): string {
  switch (figure.kind) {
    case 'integrity-failed':
      return 'Latest integrity test failed.';
    case 'life-ended':
      return figure.because;
    case 'cycles-left':
      return `${figure.cyclesLeft} ${plural(figure.cyclesLeft, 'care cycle', 'care cycles')} left (${figure.factor}).`;
    case 'budget-used':
      return `${Math.round(figure.fraction * 100)} % of rated ${figure.factor} used.`;
    case 'flow-recovery':
      return `Flow recovery ${round(figure.latestPct)} %, floor ${figure.minPct} %.`;
  }
}

/**
 * What makes one cartridge worth a look, from the engine's life forecast: a failed latest
 * integrity test, an ended life, few cycles left, a rated budget mostly used, or flow
 * recovery close to its floor. Empty when nothing does.
 */
function findingsOf(life: CartridgeLifeVerdict, latestIntegrityAt: Date | null): Finding[] {
  const found: Finding[] = [];
  if (life.integrity.latestPass === false) {
    found.push({ rank: 0, closeness: 1, reason: 'Latest integrity test failed', figure: { kind: 'integrity-failed', at: (latestIntegrityAt ?? new Date(0)).toISOString() } });
  }
  if (life.ended) {
    for (const because of life.endedBecause) {
      if (/integrity/i.test(because)) continue;
      found.push({ rank: 1, closeness: 1, reason: 'Life forecast has ended', figure: { kind: 'life-ended', because } });
    }
  } else {
    if (life.remainingCycles !== null && life.limitingFactor && life.remainingCycles <= CYCLES_LEFT_WATCH) {
      found.push({
        rank: 2,
        closeness: 1 - life.remainingCycles / (CYCLES_LEFT_WATCH + 1),
        reason: 'Near the end of its life',
        figure: { kind: 'cycles-left', cyclesLeft: life.remainingCycles, factor: life.limitingFactor },
      });
    }
    for (const b of life.budgets) {
      if (b.fraction === null || b.used === null || b.rated === null || b.fraction < BUDGET_WATCH_FRACTION) continue;
      found.push({
        rank: 3,
        closeness: (b.fraction - BUDGET_WATCH_FRACTION) / (1 - BUDGET_WATCH_FRACTION),
        reason: `Most of its rated ${b.factor} used`,
        figure: { kind: 'budget-used', factor: b.factor, used: b.used, rated: b.rated, fraction: b.fraction },
      });
    }
    const { latestPct, minPct } = life.recovery;
    if (latestPct !== null && latestPct < minPct + RECOVERY_MARGIN_PCT) {
      found.push({
        rank: 3,
        closeness: 1 - (latestPct - minPct) / RECOVERY_MARGIN_PCT,
        reason: 'Flow recovery near its floor',
        figure: { kind: 'flow-recovery', latestPct, minPct },
      });
    }
  }
  return found.sort((a, b) => a.rank - b.rank || b.closeness - a.closeness);
}

/** The landing page: the next bottling days, lots and cartridges that need a look, stock shortfalls and the header counts. */
export function createTodayService(db: Database) {
  const repo = createTodayRepository(db);
  const cellar = createCellarService(db);
  const cartridges = createCartridgesService(db);
  const lifeInputs = createLifeInputsService(db);
  const plans = createPlansService(db);
  const runsInProgress = createRunsInProgressService(db);

  /**
   * The next bottling days: draft and approved plans dated today (UTC) or later, soonest first.
   * One query for the ids, then the plans' details from the plans service (their needs are the
   * engine's figures against stock), at most TODAY_PLANS_MAX of them.
   */
  async function upcomingPlans(tenant: TenantContext, now: Date): Promise<TodayPlanDto[]> {
    const ids = await repo.upcomingPlanIds(tenant.wineryId, now.toISOString().slice(0, 10), TODAY_PLANS_MAX);
    // One read of the catalogue and stock for all of them; a plan deleted between the two reads is left out.
    const details = await plans.getMany(tenant, ids);
    return details.flatMap((p) => (p.status !== 'done' ? [presentTodayPlan({ ...p, status: p.status })] : []));
  }

  /**
   * Cartridges to look at, most urgent first. Each cartridge's life check is stored
   * (cartridge_life_flags) and worked out again only when something it reads has changed since:
   * the cartridges left stale are forecast here and stored, then the flagged ones are read,
   * the first TODAY_CARTRIDGES_MAX of them with the total. Three queries at once when nothing changed.
   */
  async function cartridgesToLookAt(wineryId: string, now: Date) {
    // The flagged ones are read alongside; read again only when some checks had to be stored.
    const [types, stale, flaggedBefore] = await Promise.all([
      lifeInputs.lifeTypes(wineryId),
      repo.staleLifeChecks(wineryId),
      repo.flaggedCartridges(wineryId, TODAY_CARTRIDGES_MAX),
    ]);
    const typeById = new Map(types.map((t) => [t.id, t]));
    if (stale.length > 0) {
      await repo.storeLifeChecks(
        stale.map((row) => {
          const type = typeById.get(row.typeId);
          const none = { id: row.id, version: row.version, rank: null, closeness: null, attention: null };
          if (!type) return none;
          const history = row.events.map(([kind, atMs, details]) => ({ kind, at: new Date(atMs), details: details ?? {} }));
          const { life } = lifeVerdictFromHistory(type, row, history, now);
          if (!life) return none;
          const integrityAt = history.filter((e) => e.kind === 'integrity').reduce<Date | null>((latest, e) => (!latest || e.at > latest ? e.at : latest), null);
          const [lead, ...rest] = findingsOf(life, integrityAt);
          if (!lead) return none;
          return { ...none, rank: lead.rank, closeness: Number.isFinite(lead.closeness) ? lead.closeness : 0, attention: { reason: lead.reason, figure: lead.figure, alsoNoted: rest.map((f) => noteOf(f.figure)) } };
        }),
      );
    }
    const { rows, total } = stale.length > 0 ? await repo.flaggedCartridges(wineryId, TODAY_CARTRIDGES_MAX) : flaggedBefore;
    // the same order as the database's, with the serials compared as people read them
    rows.sort((a, b) => a.rank - b.rank || b.closeness - a.closeness || a.cartridge.serial.localeCompare(b.cartridge.serial));
    return {
      attention: rows.flatMap((row) =>
        row.attention ? [presentTodayCartridge(row, typeById.get(row.cartridge.typeId)?.name ?? 'Unknown type', row.attention as { reason: string; figure: TodayCartridgeFigure; alsoNoted: string[] })] : [],
      ),
      attentionTotal: total,
    };
  }

  return {
    async today(tenant: TenantContext, now = new Date()): Promise<TodayDto> {
      const [lots, summary, counts, toLookAt, planned, running] = await Promise.all([
        cellar.listLots(tenant, ALL_LOTS),
        cartridges.summary(tenant),
        repo.counts(tenant.wineryId),
        cartridgesToLookAt(tenant.wineryId, now),
        upcomingPlans(tenant, now),
        // the runs in progress with their stages' forecasts: one query of their own
        runsInProgress.inProgress(tenant),
      ]);

      const byVerdict: Record<ReadinessVerdict, number> = { ready: 0, borderline: 0, 'not-ready': 0, unknown: 0 };
      for (const lot of lots.items) byVerdict[lot.readiness.verdict] += 1;
      const needLook = lots.items
        .filter((l) => l.readiness.verdict !== 'ready')
        .sort((a, b) => verdictRank[a.readiness.verdict] - verdictRank[b.readiness.verdict] || a.code.localeCompare(b.code));

      const { totals } = summary;
      const types = summary.types.map(presentStockType);
      return {
        counts: {
          lots: lots.total,
          tanks: counts.tanks,
          housings: counts.housings,
          housingsWithFreeRounds: counts.housingsWithFreeRounds,
          cartridgeTypes: summary.types.length,
          cartridges: totals.inStock.count + totals.installed.count + totals.regenerating.count,
          cartridgesInstalled: totals.installed.count,
        },
        lots: {
          byVerdict,
          attention: needLook.slice(0, TODAY_LOTS_MAX).map((l) => presentTodayLot(l, leadReason(l))),
          attentionTotal: needLook.length,
        },
        cartridges: toLookAt,
        stock: { types, shortfalls: types.filter((t) => t.shortfall).length },
        upcomingPlans: planned,
        runsInProgress: running,
      };
    },
  };
}
export type TodayService = ReturnType<typeof createTodayService>;
