import {
  allowedPressureDecayMbar,
  diffusionLimitForHousing,
  evaluateIntegrityTest,
  expectedBubblePointBar,
  formatNumber,
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

/** The clean-water flow to compare recovery against: as new when registered with it, else the first flow after a cycle. */
async function flowBasis(repo: CareRepository, wineryId: string, cartridgeId: string): Promise<CareTargetDto['flowBasis']> {
  const rows = await repo.flowHistory(wineryId, cartridgeId);
  for (const r of rows) {
    const v = num(r.details?.waterFlowNewLh);
    if (r.kind === 'registered' && v !== undefined && v > 0) return { kind: 'new', flowLh: v };
  }
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
      return presentCareTarget(row.cartridge, row.type, row.housing, await flowBasis(repo, tenant.wineryId, id));
    },

    /** Logs a cycle and counts it on the cartridge, in one transaction; answers with the updated forecast. */
    async logCycle(tenant: TenantContext, id: string, input: LogCycleInput): Promise<CycleResultDto> {
      const eventId = await db.transaction(async (tx) => {
        const txRepo = createCareRepository(tx);
        const row = await txRepo.target(tenant.wineryId, id, { lock: true });
        if (!row) throw notFound('Cartridge');
        const { cartridge: c, type, housing } = row;
        if (c.status === 'retired') throw conflict(`${c.serial} is retired; care cycles are no longer logged for it.`, 'retired');
        if (input.tempC !== undefined && input.tempC !== null) {
          if (input.tempC > type.maxTempC) {
            throw badRequest('Check the highlighted fields.', {
              tempC: `${type.name} is rated to ${formatNumber(type.maxTempC, 0)} °C at most; ${formatNumber(input.tempC, 0)} °C is above that limit.`,
            });
          }
          if (c.status === 'installed' && housing && input.tempC > housing.maxTempC) {
            throw badRequest('Check the highlighted fields.', {
              tempC: `${housing.name} is rated to ${formatNumber(housing.maxTempC, 0)} °C at most; ${formatNumber(input.tempC, 0)} °C is above that limit.`,
            });
          }
        }
        const installed = c.status === 'installed';
        const newId = await txRepo.insertEvent({
          wineryId: tenant.wineryId,
          cartridgeId: c.id,
          kind: 'cycle',
          actorId: tenant.userId,
          housingId: installed ? c.housingId : null,
          position: installed ? c.position : null,
          at: input.at ? new Date(input.at) : new Date(),
          details: given({
            kind: input.kind,
            tempC: input.tempC,
            durationMin: input.durationMin,
            agent: input.agent,
            concentrationPct: input.concentrationPct,
            waterFlowBeforeLh: input.waterFlowBeforeLh,
            waterFlowAfterLh: input.waterFlowAfterLh,
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
      const eq10 = c.lengthIn / 10;
      let test: IntegrityTestInput;
      let limits: Record<string, unknown>;
      if (input.test === 'bubble-point') {
        if (type.bubblePointMinBar === null) throw badRequest(`${type.name} has no minimum bubble point in the catalogue. Enter it on the cartridge type (from the maker's certificate) first.`);
        if (input.wettingFluid === 'wine') {
          throw badRequest('Check the highlighted fields.', { wettingFluid: `The minimum bubble point of ${type.name} is stated for a water-wet membrane. Wet it with water for this test.` });
        }
        const minimumBar = input.tempC !== undefined && input.tempC !== null
          ? expectedBubblePointBar({ waterBubblePointBar: type.bubblePointMinBar, tempC: input.tempC })
          : type.bubblePointMinBar;
        test = { kind: 'bubble-point', measuredBar: input.bubblePointBar as number, minimumBar };
        limits = { measuredBar: input.bubblePointBar, minBar: minimumBar, typeMinBar: type.bubblePointMinBar };
      } else {
        if (type.diffusionMaxMlMinPer10in === null) throw badRequest(`${type.name} has no diffusion limit in the catalogue. Enter it on the cartridge type (from the maker's certificate) first.`);
        const maxMlMin = diffusionLimitForHousing(type.diffusionMaxMlMinPer10in, eq10);
        if (input.test === 'diffusion') {
          test = { kind: 'diffusion', measuredMlMin: input.diffusionMlMin as number, maximumMlMin: maxMlMin };
          limits = { measuredMlMin: input.diffusionMlMin, maxMlMin, elementEquivalents: eq10 };
        } else {
          const upstream = installed ? housing.upstreamGasVolumeL : null;
          if (!installed) throw badRequest('Install the cartridge in its housing first: the allowed decay depends on the housing\u2019s upstream gas volume.');
          if (upstream === null || !(upstream > 0)) {
            throw badRequest(`Enter the upstream gas volume of ${housing.name} (Equipment) first: the allowed decay depends on it.`, { upstreamGasVolumeL: 'Enter the housing\u2019s upstream gas volume.' });
          }
          const maxDecayMbar = allowedPressureDecayMbar({ diffusionLimitMlMin: maxMlMin, testMin: input.testMin as number, upstreamVolumeL: upstream });
          test = { kind: 'pressure-hold', measuredDecayMbar: input.decayMbar as number, maximumDecayMbar: maxDecayMbar };
          limits = { measuredDecayMbar: input.decayMbar, testMin: input.testMin, maxDecayMbar, maxMlMin, upstreamGasVolumeL: upstream, elementEquivalents: eq10 };
        }
      }
      const verdict = evaluateIntegrityTest(test);
      const eventId = await audited(db, tenant, { action: 'create', kind: 'integrity-test' }, (tx) => createCareRepository(tx).insertEvent({
        wineryId: tenant.wineryId,
        cartridgeId: c.id,
        kind: 'integrity',
        actorId: tenant.userId,
        housingId: installed ? c.housingId : null,
        position: installed ? c.position : null,
        at: input.at ? new Date(input.at) : new Date(),
        details: given({
          pass: verdict.pass,
          test: input.test,
          method: integrityTestLabels[input.test].toLowerCase(),
          reason: verdict.reason,
          ...limits,
          tempC: input.tempC,
          wettingFluid: input.wettingFluid,
          note: input.notes,
        }),
      }));
      const [event, life] = await Promise.all([savedEvent(tenant.wineryId, eventId), lifeOf(tenant, id)]);
      return { event, test: input.test, pass: verdict.pass, reason: verdict.reason, ...life };
    },

    /** The winery's latest care events, newest first. */
    async recent(tenant: TenantContext): Promise<CareRecentDto> {
      const rows = await repo.recent(tenant.wineryId, RECENT_CARE_LIMIT);
      return { items: rows.map(presentCareEvent) };
    },
  };
}

export type CareService = ReturnType<typeof createCareService>;
