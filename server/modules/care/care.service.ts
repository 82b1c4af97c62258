import {
  allowedPressureDecayMbar,
  diffusionLimitForHousing,
  elementEquivalents,
  evaluateIntegrityTest,
  formatNumber,
  judgeBubblePoint,
  type IntegrityTestInput,
} from '../../../shared/engine';
import { integrityTestLabels, type LogCycleInput, type RecordIntegrityInput } from '../../../shared/schemas/care';
import type { CareRecentDto, CareTargetDto, CycleResultDto, IntegrityResultDto } from '../../../shared/types/care';
import type { Database } from '../../db/client';
import { badRequest, conflict, notFound } from '../../lib/errors';
import type { TenantContext } from '../../middleware/authorize';
import { createCartridgesService } from '../cartridges/cartridges.service';
import { presentCareEvent, presentCareTarget } from './care.presenter';
import { createCareRepository, type CareRepository } from './care.repository';
import { audited, recordChange } from '../audit/audit.service';

export const RECENT_CARE_LIMIT = 30;

const COUNTERS = { steam: 'steamCycles', 'hot-water': 'hotWaterCycles', chemical: 'chemicalCycles' } as const;
const num = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? v : undefined);
/** Keeps only the values that were given (stored details carry no nulls). */
const given = (o: Record<string, unknown>) => Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined && v !== null && v !== ''));

/** What every Care event row states: the winery, the cartridge, who, where it sat (only when installed) and when (now unless given). */
const eventHead = (tenant: TenantContext, c: { id: string; housingId: string | null; position: number | null }, installed: boolean, at: string | null | undefined) => ({
  wineryId: tenant.wineryId,
  cartridgeId: c.id,
  actorId: tenant.userId,
  housingId: installed ? c.housingId : null,
  position: installed ? c.position : null,
  at: at ? new Date(at) : new Date(),
});

/** 10-inch equivalents of all cartridges installed in a housing (PDA TR 26: a housing test covers them all). */
async function housingEquivalents(repo: CareRepository, wineryId: string, housingId: string): Promise<number> {
  const lengths = await repo.installedLengths(wineryId, housingId);
  const sum = lengths.reduce((acc, lengthIn) => acc + elementEquivalents({ cartridges: 1, lengthIn }), 0);
  return Math.max(1, Math.round(sum));
}

/** The clean-water flow to compare recovery against: as new when registered with it, else the first flow after a cycle. */
async function flowBasis(repo: CareRepository, wineryId: string, cartridgeId: string, spec?: { perTenInLh: number; lengthIn: number }): Promise<CareTargetDto['flowBasis']> {
  const rows = await repo.flowHistory(wineryId, cartridgeId);
  for (const r of rows) {
    const v = num(r.details?.waterFlowNewLh);
    if (r.kind === 'registered' && v !== undefined && v > 0) return { kind: 'new', flowLh: v };
  }
  // the type's clean-water spec for this length: what a new cartridge should pass at 20 °C
  if (spec && spec.perTenInLh > 0) return { kind: 'spec', flowLh: (spec.perTenInLh * spec.lengthIn) / 10 };
  for (const r of rows) {
    const v = num(r.details?.waterFlowAfterLh);
    if (r.kind === 'cycle' && v !== undefined && v > 0) return { kind: 'first-after', flowLh: v };
  }
  return null;
}

export function createCareService(db: Database) {
  const repo = createCareRepository(db);
  const cartridges = createCartridgesService(db);

  async function lifeOf(tenant: TenantContext, id: string) {
    const detail = await cartridges.detail(tenant, id);
    return { life: detail.life, lifeError: detail.lifeError };
  }

  async function savedEvent(wineryId: string, eventId: string) {
    const row = await repo.event(wineryId, eventId);
    if (!row) throw notFound('Care record');
    return presentCareEvent(row);
  }

  return {
    /** A cartridge's limits and flow basis, for the care forms. */
    async target(tenant: TenantContext, id: string): Promise<CareTargetDto> {
      const row = await repo.target(tenant.wineryId, id);
      if (!row) throw notFound('Cartridge');
      const installed = row.cartridge.status === 'installed' && row.housing !== null;
      const eqHousing = installed && row.housing ? await housingEquivalents(repo, tenant.wineryId, row.housing.id) : null;
      return presentCareTarget(row.cartridge, row.type, row.housing, await flowBasis(repo, tenant.wineryId, id, { perTenInLh: row.type.waterFlowLhPer10in, lengthIn: row.cartridge.lengthIn }), eqHousing);
    },

    /** Logs a cycle and counts it on the cartridge, in one transaction; answers with the updated forecast. */
    async logCycle(tenant: TenantContext, id: string, input: LogCycleInput): Promise<CycleResultDto> {
      const eventId = await db.transaction(async (tx) => {
        const txRepo = createCareRepository(tx);
        const row = await txRepo.target(tenant.wineryId, id, { lock: true });
        if (!row) throw notFound('Cartridge');
        const { cartridge: c, type, housing } = row;
        if (c.status === 'retired') throw conflict(`${c.serial} is retired; care cycles are no longer logged for it.`, 'retired');
        let aboveRating: { ratedMaxC: number } | null = null;
        if (input.tempC !== undefined && input.tempC !== null) {
          const ratings = [{ name: type.name, max: type.maxTempC }];
          if (c.status === 'installed' && housing) ratings.push({ name: housing.name, max: housing.maxTempC });
          const over = ratings.filter((r) => input.tempC! > r.max).sort((x, y) => x.max - y.max)[0];
          if (over) {
            if (input.aboveRatingConfirmed !== true) {
              throw badRequest('Check the highlighted fields.', {
                tempC: `${over.name} is rated to ${formatNumber(over.max, 0)} °C at most; ${formatNumber(input.tempC, 0)} °C is above that limit. If the cycle really ran this hot, confirm it to record it: it will be flagged on the cartridge.`,
              });
            }
            aboveRating = { ratedMaxC: over.max };
          }
        }
        if (input.flowBasis === 'housing' && !(c.status === 'installed' && housing)) {
          throw badRequest('Check the highlighted fields.', { flowBasis: 'The cartridge is not in a housing: enter its own flow.' });
        }
        const housingEq = input.flowBasis === 'housing' && housing ? await housingEquivalents(txRepo, tenant.wineryId, housing.id) : undefined;
        const installed = c.status === 'installed';
        const hasFlow = (input.waterFlowBeforeLh ?? null) !== null || (input.waterFlowAfterLh ?? null) !== null;
        const newId = await txRepo.insertEvent({
          ...eventHead(tenant, c, installed, input.at),
          kind: 'cycle',
          details: given({
            kind: input.kind,
            tempC: input.tempC,
            durationMin: input.durationMin,
            agent: input.agent,
            concentrationPct: input.concentrationPct,
            waterFlowBeforeLh: input.waterFlowBeforeLh,
            waterFlowAfterLh: input.waterFlowAfterLh,
            waterTempC: input.waterTempC,
            // the ΔP the flows were measured at: as given, else the type's specification ΔP (kept with the record)
            flowDpBar: hasFlow ? (input.flowDpBar ?? type.waterDpBar) : undefined,
            flowBasis: input.flowBasis,
            housingEquivalents: housingEq,
            ...(aboveRating ? { aboveRating: true, ratedMaxC: aboveRating.ratedMaxC } : {}),
          }),
        });
        if (input.kind !== 'backflush') await txRepo.bumpCounter(tenant.wineryId, c.id, COUNTERS[input.kind]);
        await recordChange(tx, tenant, { action: 'create', kind: 'care-cycle', id: newId });
        return newId;
      });
      const [event, counters, life] = await Promise.all([savedEvent(tenant.wineryId, eventId), repo.counters(tenant.wineryId, id), lifeOf(tenant, id)]);
      if (!counters) throw notFound('Cartridge');
      return { event, ...counters, ...life };
    },

    /** Judges an integrity test against the type's limits (engine) and stores the verdict. */
    async recordIntegrity(tenant: TenantContext, id: string, input: RecordIntegrityInput): Promise<IntegrityResultDto> {
      const row = await repo.target(tenant.wineryId, id);
      if (!row) throw notFound('Cartridge');
      const { cartridge: c, type, housing } = row;
      if (c.status === 'retired') throw conflict(`${c.serial} is retired; tests are no longer recorded for it.`, 'retired');
      const installed = c.status === 'installed' && housing !== null;
      // a diffusion or pressure-hold test of an installed cartridge covers its whole housing
      const eq10 = installed ? await housingEquivalents(repo, tenant.wineryId, housing.id) : elementEquivalents({ cartridges: 1, lengthIn: c.lengthIn });
      let test: IntegrityTestInput | null = null;
      let limits: Record<string, unknown>;
      let judged: { pass: boolean; reason: string; final: boolean } | null = null;
      if (input.test === 'bubble-point') {
        if (type.bubblePointMinBar === null) throw badRequest(`${type.name} has no minimum bubble point in the catalogue. Enter it on the cartridge type (from the maker's certificate) first.`);
        const fluid = input.wettingFluid ?? 'water';
        const strength = input.ethanolPctVol ?? null;
        if (fluid !== 'water' && (input.tempC ?? 20) > 50) {
          throw badRequest('Check the highlighted fields.', { tempC: 'A test wetted with wine or ethanol–water is judged from 0 to 50 °C.' });
        }
        const j = judgeBubblePoint({
          measuredBar: input.bubblePointBar as number,
          waterMinBar: type.bubblePointMinBar,
          tempC: input.tempC ?? undefined,
          wetting: fluid === 'water' ? { liquid: 'water' } : { liquid: fluid, ethanolPctVol: strength as number },
        });
        judged = j;
        limits = { measuredBar: input.bubblePointBar, minBar: j.minimumBar, typeMinBar: type.bubblePointMinBar, ...(fluid !== 'water' ? { ethanolPctVol: strength } : {}) };
      } else {
        if (type.diffusionMaxMlMinPer10in === null) throw badRequest(`${type.name} has no diffusion limit in the catalogue. Enter it on the cartridge type (from the maker's certificate) first.`);
        const maxMlMin = diffusionLimitForHousing(type.diffusionMaxMlMinPer10in, eq10);
        if (input.test === 'diffusion') {
          test = { kind: 'diffusion', measuredMlMin: input.diffusionMlMin as number, maximumMlMin: maxMlMin };
          limits = { measuredMlMin: input.diffusionMlMin, maxMlMin, elementEquivalents: eq10, limitBasis: installed ? 'housing' : 'cartridge' };
        } else {
          const upstream = installed ? housing.upstreamGasVolumeL : null;
          if (!installed) throw badRequest('Install the cartridge in its housing first: the allowed decay depends on the housing\u2019s upstream gas volume.');
          if (upstream === null || !(upstream > 0)) {
            throw badRequest(`Enter the upstream gas volume of ${housing.name} (Equipment) first: the allowed decay depends on it.`, { upstreamGasVolumeL: 'Enter the housing\u2019s upstream gas volume.' });
          }
          const maxDecayMbar = allowedPressureDecayMbar({ diffusionLimitMlMin: maxMlMin, testMin: input.testMin as number, upstreamVolumeL: upstream });
          test = { kind: 'pressure-hold', measuredDecayMbar: input.decayMbar as number, maximumDecayMbar: maxDecayMbar };
          limits = { measuredDecayMbar: input.decayMbar, testMin: input.testMin, maxDecayMbar, maxMlMin, upstreamGasVolumeL: upstream, elementEquivalents: eq10, limitBasis: 'housing' };
        }
      }
      const verdict = judged ?? { ...evaluateIntegrityTest(test as IntegrityTestInput), final: true };
      const eventId = await audited(db, tenant, { action: 'create', kind: 'integrity-test' }, (tx) => createCareRepository(tx).insertEvent({
        ...eventHead(tenant, c, installed, input.at),
        kind: 'integrity',
        details: given({
          pass: verdict.pass,
          ...(verdict.final ? {} : { retest: true }),
          test: input.test,
          method: integrityTestLabels[input.test].toLowerCase(),
          reason: verdict.reason,
          ...limits,
          tempC: input.tempC,
          wettingFluid: input.test === 'bubble-point' ? (input.wettingFluid ?? 'water') : input.wettingFluid,
          note: input.notes,
        }),
      }));
      const [event, life] = await Promise.all([savedEvent(tenant.wineryId, eventId), lifeOf(tenant, id)]);
      return { event, test: input.test, pass: verdict.pass, retest: !verdict.final, reason: verdict.reason, ...life };
    },

    /** The winery's latest care events, newest first. */
    async recent(tenant: TenantContext): Promise<CareRecentDto> {
      const rows = await repo.recent(tenant.wineryId, RECENT_CARE_LIMIT);
      return { items: rows.map(presentCareEvent) };
    },
  };
}

export type CareService = ReturnType<typeof createCareService>;
