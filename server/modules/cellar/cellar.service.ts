import { defaultReadinessThresholds, type ReadinessThresholds } from '../../../shared/engine';
import { labResultInputSchema, lotInputSchema, tankInputSchema, type LabResultInput, type LabResultPatch, type LotInput, type LotPatch, type LotsListQuery, type TankInput, type TankPatch, type TanksListQuery } from '../../../shared/schemas/cellar';
import { sentFields } from '../../../shared/schemas/patch';
import type { ListDto } from '../../../shared/types/api';
import type { LabResultDto, LotDto, LotListItemDto, TankDto } from '../../../shared/types/cellar';
import type { Database, DbOrTx } from '../../db/client';
import { badRequest, conflict, notFound } from '../../lib/errors';
import { refuseIfInRecord } from '../archive/archive.service';
import type { TenantContext } from '../../middleware/authorize';
import { readinessThresholdsFor } from '../winery-settings/winery-settings.service';
import { isUniqueViolation } from '../../db/errors';
import { parseOrThrow } from '../../middleware/validate';
import { analyseLabResult, readinessOf, thresholdsUsed } from './lab-analysis';
import { createLabResultsRepository, type LabResultRow, type LabResultValues } from './lab-results.repository';
import { createLotsRepository, LOT_CODE_UNIQUE, type LotRow, type LotValues } from './lots.repository';
import { presentLabResult, presentLot, presentLotListItem, presentTank } from './cellar.presenter';
import { createTanksRepository, TANK_NAME_UNIQUE, type TankRow, type TankValues } from './tanks.repository';
import { audited } from '../audit/audit.service';

const repos = (db: DbOrTx) => ({
  tanks: createTanksRepository(db),
  lots: createLotsRepository(db),
  labResults: createLabResultsRepository(db),
});

const tankValues = (input: TankInput): TankValues => ({ name: input.name, capacityL: input.capacityL, notes: input.notes });

const lotValues = (input: LotInput): LotValues => ({
  code: input.code,
  name: input.name,
  style: input.style,
  vintage: input.vintage ?? null,
  volumeL: input.volumeL,
  tankId: input.tankId ?? null,
  ethanolPctVol: input.ethanolPctVol,
  sugarGPerL: input.sugarGPerL,
  tempC: input.tempC,
  notes: input.notes,
});

const labResultValues = (input: LabResultInput): LabResultValues => {
  const points = input.discPoints && input.discPoints.length > 0 ? input.discPoints.map((p) => ({ timeS: p.timeS, volumeMl: p.volumeMl })) : null;
  return {
    sampledAt: new Date(input.sampledAt),
    turbidityNtu: input.turbidityNtu ?? null,
    t200s: input.t200s ?? null,
    t400s: input.t400s ?? null,
    discPoints: points,
    discDiameterMm: input.discDiameterMm ?? null,
    discPressureBar: input.discPressureBar ?? null,
    freeSo2MgL: input.freeSo2MgL ?? null,
    notes: input.notes,
  };
};

// PATCH: the stored record as an input, the sent fields over it, and the whole checked again.
const tankInputOf = (row: TankRow) => ({ name: row.name, capacityL: row.capacityL, notes: row.notes });
const lotInputOf = (row: LotRow) => ({
  code: row.code,
  name: row.name,
  style: row.style,
  vintage: row.vintage,
  volumeL: row.volumeL,
  tankId: row.tankId,
  ethanolPctVol: row.ethanolPctVol,
  sugarGPerL: row.sugarGPerL,
  tempC: row.tempC,
  notes: row.notes,
});
const labResultInputOf = (row: LabResultRow) => ({
  sampledAt: row.sampledAt.toISOString(),
  turbidityNtu: row.turbidityNtu,
  t200s: row.t200s,
  t400s: row.t400s,
  discPoints: row.discPoints,
  discDiameterMm: row.discDiameterMm,
  discPressureBar: row.discPressureBar,
  freeSo2MgL: row.freeSo2MgL,
  notes: row.notes,
});

const duplicateTank = (name: string) => conflict(`There is already a tank called "${name}". Choose another name.`, 'duplicate_tank');
const duplicateLot = (code: string) => conflict(`Lot code ${code} is already used in this winery. Choose another code.`, 'duplicate_lot_code');

const presentResult = (row: LabResultRow, thresholds: ReadinessThresholds) => presentLabResult(row, analyseLabResult(row, thresholds));

/** Whether the thresholds are the untouched defaults (the winery has not set its own). */
const isDefaultThresholds = (t: ReadinessThresholds) => t === defaultReadinessThresholds || JSON.stringify(t) === JSON.stringify(defaultReadinessThresholds);

/** Tanks, lots and lab results of a winery, with the readiness verdict from the engine. */
export function createCellarService(db: Database) {
  const r = repos(db);

  async function requireTankOfWinery(dbx: DbOrTx, wineryId: string, tankId: string | null | undefined) {
    if (tankId && !(await createTanksRepository(dbx).exists(wineryId, tankId))) {
      throw badRequest('Check the highlighted fields.', { tankId: "Choose one of this winery's tanks." });
    }
  }

  async function getTank(tenant: TenantContext, id: string): Promise<TankDto> {
    const row = await r.tanks.find(tenant.wineryId, id);
    if (!row) throw notFound('Tank');
    return presentTank(row);
  }

  async function getLot(tenant: TenantContext, id: string): Promise<LotDto> {
    const [row, latest, thresholds] = await Promise.all([
      r.lots.find(tenant.wineryId, id),
      r.labResults.latest(tenant.wineryId, id),
      readinessThresholdsFor(db, tenant.wineryId),
    ]);
    if (!row) throw notFound('Lot');
    const analysis = latest ? analyseLabResult(latest, thresholds) : null;
    const readiness = readinessOf(row.style, latest && analysis ? { ...latest, analysis } : null, thresholds);
    return presentLot(
      row,
      latest && analysis ? presentLabResult(latest, analysis) : null,
      readiness,
      thresholdsUsed(row.style, thresholds, isDefaultThresholds(thresholds)),
    );
  }

  async function getLabResult(tenant: TenantContext, lotId: string, id: string): Promise<LabResultDto> {
    const [row, thresholds] = await Promise.all([r.labResults.find(tenant.wineryId, lotId, id), readinessThresholdsFor(db, tenant.wineryId)]);
    if (!row) throw notFound('Lab result');
    return presentResult(row, thresholds);
  }

  const service = {
    // ----- tanks -----
    async listTanks(tenant: TenantContext, query: TanksListQuery): Promise<ListDto<TankDto>> {
      const { rows, total } = await r.tanks.list(tenant.wineryId, query);
      return { items: rows.map(presentTank), total };
    },
    getTank,
    async createTank(tenant: TenantContext, input: TankInput) {
      try {
        return await getTank(tenant, await audited(db, tenant, { action: 'create', kind: 'tank' }, (tx) => createTanksRepository(tx).insert(tenant.wineryId, tankValues(input))));
      } catch (error) {
        if (isUniqueViolation(error, TANK_NAME_UNIQUE)) throw duplicateTank(input.name);
        throw error;
      }
    },
    async updateTank(tenant: TenantContext, id: string, input: TankInput, now = new Date()) {
      try {
        if (!(await audited(db, tenant, { action: 'update', kind: 'tank', id }, (tx) => createTanksRepository(tx).update(tenant.wineryId, id, tankValues(input), now)))) throw notFound('Tank');
      } catch (error) {
        if (isUniqueViolation(error, TANK_NAME_UNIQUE)) throw duplicateTank(input.name);
        throw error;
      }
      return getTank(tenant, id);
    },
    /** Refuses (409) while lots are in the tank: their records name it. */
    async deleteTank(tenant: TenantContext, id: string) {
      await db.transaction(async (tx) => {
        const t = createTanksRepository(tx);
        if (!(await t.lockForDelete(tenant.wineryId, id))) throw notFound('Tank');
        const n = await t.lotsIn(tenant.wineryId, id);
        if (n > 0) {
          throw conflict(
            `This tank holds ${n} lot${n === 1 ? '' : 's'}. Move ${n === 1 ? 'it' : 'them'} to another tank (or clear the tank on the lot) before deleting it.`,
            'tank_in_use',
          );
        }
        await audited(tx, tenant, { action: 'delete', kind: 'tank', id }, () => t.delete(tenant.wineryId, id));
      });
    },

    // ----- lots -----
    /** A page of lots with the latest lab result summary and the readiness verdict of each. */
    async listLots(tenant: TenantContext, query: LotsListQuery): Promise<ListDto<LotListItemDto>> {
      const [{ rows, total }, thresholds] = await Promise.all([r.lots.list(tenant.wineryId, query), readinessThresholdsFor(db, tenant.wineryId)]);
      const items = rows.map((row) => {
        const latest =
          row.latestSampledAt === null
            ? null
            : {
                sampledAt: row.latestSampledAt,
                turbidityNtu: row.latestTurbidityNtu,
                t200s: row.latestT200s,
                t400s: row.latestT400s,
                discDiameterMm: row.latestDiscDiameterMm,
                discPoints: row.latestDiscPoints,
              };
        const withAnalysis = latest ? { ...latest, analysis: analyseLabResult(latest, thresholds) } : null;
        return presentLotListItem(row, withAnalysis, readinessOf(row.style, withAnalysis, thresholds));
      });
      return { items, total };
    },
    getLot,
    async createLot(tenant: TenantContext, input: LotInput) {
      const id = await db.transaction(async (tx) => {
        await requireTankOfWinery(tx, tenant.wineryId, input.tankId);
        try {
          return await audited(tx, tenant, { action: 'create', kind: 'lot' }, () => createLotsRepository(tx).insert(tenant.wineryId, lotValues(input)));
        } catch (error) {
          if (isUniqueViolation(error, LOT_CODE_UNIQUE)) throw duplicateLot(input.code);
          throw error;
        }
      });
      return getLot(tenant, id);
    },
    async updateLot(tenant: TenantContext, id: string, input: LotInput, now = new Date()) {
      await db.transaction(async (tx) => {
        const lots = createLotsRepository(tx);
        if (!(await lots.exists(tenant.wineryId, id))) throw notFound('Lot');
        await requireTankOfWinery(tx, tenant.wineryId, input.tankId);
        try {
          await audited(tx, tenant, { action: 'update', kind: 'lot', id }, () => lots.update(tenant.wineryId, id, lotValues(input), now));
        } catch (error) {
          if (isUniqueViolation(error, LOT_CODE_UNIQUE)) throw duplicateLot(input.code);
          throw error;
        }
      });
      return getLot(tenant, id);
    },
    /** Deletes a lot with its lab results; refuses (409) while files are attached to them. */
    async deleteLot(tenant: TenantContext, id: string) {
      await db.transaction(async (tx) => {
        const lots = createLotsRepository(tx);
        if (!(await lots.exists(tenant.wineryId, id))) throw notFound('Lot');
        await refuseIfInRecord(tx, 'lots', tenant.wineryId, id);
        const files = await lots.attachmentCount(tenant.wineryId, id);
        if (files > 0) {
          throw conflict(`This lot has ${files} attached file${files === 1 ? '' : 's'}. Remove them first, so no report is left without its lot.`, 'lot_has_attachments');
        }
        await audited(tx, tenant, { action: 'delete', kind: 'lot', id }, () => lots.delete(tenant.wineryId, id));
      });
    },

    // ----- lab results -----
    async listLabResults(tenant: TenantContext, lotId: string): Promise<ListDto<LabResultDto>> {
      if (!(await r.lots.exists(tenant.wineryId, lotId))) throw notFound('Lot');
      const [rows, thresholds] = await Promise.all([r.labResults.list(tenant.wineryId, lotId), readinessThresholdsFor(db, tenant.wineryId)]);
      return { items: rows.map((row) => presentResult(row, thresholds)), total: rows.length };
    },
    getLabResult,
    async createLabResult(tenant: TenantContext, lotId: string, input: LabResultInput) {
      if (!(await r.lots.exists(tenant.wineryId, lotId))) throw notFound('Lot');
      const id = await audited(db, tenant, { action: 'create', kind: 'lab-result' }, (tx) => createLabResultsRepository(tx).insert(tenant.wineryId, lotId, tenant.userId, labResultValues(input)));
      return getLabResult(tenant, lotId, id);
    },
    async updateLabResult(tenant: TenantContext, lotId: string, id: string, input: LabResultInput, now = new Date()) {
      if (!(await audited(db, tenant, { action: 'update', kind: 'lab-result', id }, (tx) => createLabResultsRepository(tx).update(tenant.wineryId, lotId, id, labResultValues(input), now)))) throw notFound('Lab result');
      return getLabResult(tenant, lotId, id);
    },
    async deleteLabResult(tenant: TenantContext, lotId: string, id: string) {
      await db.transaction(async (tx) => {
        const results = createLabResultsRepository(tx);
        if (!(await results.find(tenant.wineryId, lotId, id))) throw notFound('Lab result');
        const files = await results.attachmentCount(tenant.wineryId, id);
        if (files > 0) {
          throw conflict(`This lab result has ${files} attached file${files === 1 ? '' : 's'}. Remove them first.`, 'lab_result_has_attachments');
        }
        await audited(tx, tenant, { action: 'delete', kind: 'lab-result', id }, () => results.delete(tenant.wineryId, lotId, id));
      });
    },
  };

  // PATCH: a field left out stays as stored. Like the full update it replaced, the last write wins.
  return {
    ...service,
    async patchTank(tenant: TenantContext, id: string, patch: TankPatch, now = new Date()) {
      const current = await r.tanks.find(tenant.wineryId, id);
      if (!current) throw notFound('Tank');
      return service.updateTank(tenant, id, parseOrThrow(tankInputSchema, { ...tankInputOf(current), ...sentFields(patch) }), now);
    },
    async patchLot(tenant: TenantContext, id: string, patch: LotPatch, now = new Date()) {
      const current = await r.lots.find(tenant.wineryId, id);
      if (!current) throw notFound('Lot');
      return service.updateLot(tenant, id, parseOrThrow(lotInputSchema, { ...lotInputOf(current), ...sentFields(patch) }), now);
    },
    async patchLabResult(tenant: TenantContext, lotId: string, id: string, patch: LabResultPatch, now = new Date()) {
      const current = await r.labResults.find(tenant.wineryId, lotId, id);
      if (!current) throw notFound('Lab result');
      return service.updateLabResult(tenant, lotId, id, parseOrThrow(labResultInputSchema, { ...labResultInputOf(current), ...sentFields(patch) }), now);
    },
  };
}
export type CellarService = ReturnType<typeof createCellarService>;
