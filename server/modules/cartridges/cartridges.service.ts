import {
  cartridgeLife,
  cartridgeLifeVerdict,
  normalisedWaterFlowLh,
  type CareCycle,
  type CareCycleKind,
  type CartridgeLife,
  type CartridgeLifeVerdict,
  type IntegrityResult,
} from '../../../shared/engine';
import type {
  CartridgeListQuery,
  CreateCartridgeInput,
  InstallCartridgeInput,
  RetireCartridgeInput,
  UpdateCartridgeInput,
} from '../../../shared/schemas/cartridges';
import type { ListDto } from '../../../shared/types/api';
import type {
  CartridgeDetailDto,
  CartridgeDto,
  CartridgeStockRowDto,
  CartridgeSummaryDto,
  HousingViewDto,
  ImportPreviewDto,
  ImportResultDto,
  StockFigure,
} from '../../../shared/types/cartridges';
import type { Database, DbOrTx } from '../../db/client';
import { isUniqueViolation } from '../../db/errors';
import { badRequest, conflict, HttpError, notFound } from '../../lib/errors';
import { deleteBareCartridge, refuseIfInRecord } from '../archive/archive.service';
import type { TenantContext } from '../../middleware/authorize';
import { checkDeliveryRows, parseDeliveryCsv } from './cartridges.import';
import { elementEquivalents, presentCartridge, presentEvent, presentSlotCartridge } from './cartridges.presenter';
import {
  createCartridgesRepository,
  SERIAL_CONSTRAINT,
  type CartridgeEventRow,
  type CartridgeRow,
  type CartridgesRepository,
  type CartridgeTypeRow,
} from './cartridges.repository';
import type { AuditAction } from '../../../shared/schemas/audit';
import { audited, recordChange, recordCreated } from '../audit/audit.service';

const CYCLE_KINDS: readonly CareCycleKind[] = ['steam', 'hot-water', 'chemical', 'backflush'];
const num = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? v : undefined);

/** The type's ratings the life forecast reads. */
type LifeRatings = Pick<CartridgeTypeRow, 'ratedSteamCycles' | 'ratedHotWaterCycles' | 'ratedChemicalCycles' | 'flowRecoveryMinPct' | 'waterFlowLhPer10in' | 'waterDpBar'>;

const duplicateSerial = (serial: string) => conflict(`Serial ${serial} is already registered in this winery.`, 'duplicate_serial');

/**
 * The engine's inputs from stored rows: ratings from the type, care cycles and integrity
 * tests from the history (oldest first), the as-new water flow when it was recorded at
 * registration. Returns null and a plain reason when the stored history is out of range.
 */
export function lifeFromHistory(
  type: CartridgeTypeRow,
  cartridge: Pick<CartridgeRow, 'litresFiltered'> & Partial<Pick<CartridgeRow, 'lengthIn'>>,
  events: Pick<CartridgeEventRow, 'kind' | 'at' | 'details'>[],
  now: Date,
): { life: CartridgeLife | null; error: string | null } {
  return forecastFromHistory(cartridgeLife, type, cartridge, events, now);
}

/** As {@link lifeFromHistory}, the figures and verdict only (no plain-words account): for many cartridges at once. */
export function lifeVerdictFromHistory(
  type: LifeRatings,
  cartridge: Pick<CartridgeRow, 'litresFiltered'> & Partial<Pick<CartridgeRow, 'lengthIn'>>,
  events: Pick<CartridgeEventRow, 'kind' | 'at' | 'details'>[],
  now: Date,
): { life: CartridgeLifeVerdict | null; error: string | null } {
  return forecastFromHistory(cartridgeLifeVerdict, type, cartridge, events, now);
}

function forecastFromHistory<T>(
  forecast: (...args: Parameters<typeof cartridgeLife>) => T,
  type: LifeRatings,
  cartridge: Pick<CartridgeRow, 'litresFiltered'> & Partial<Pick<CartridgeRow, 'lengthIn'>>,
  events: Pick<CartridgeEventRow, 'kind' | 'at' | 'details'>[],
  now: Date,
): { life: T | null; error: string | null } {
  const oldestFirst = [...events].sort((a, b) => a.at.getTime() - b.at.getTime());
  const cycles: CareCycle[] = [];
  const integrity: IntegrityResult[] = [];
  let waterFlowNewLh: number | undefined;
  for (const e of oldestFirst) {
    const d = e.details ?? {};
    if (e.kind === 'cycle' && CYCLE_KINDS.includes(d.kind as CareCycleKind)) {
      // flows to one cartridge at 20 °C and the type's specification ΔP (Darcy: Q ∝ ΔP/μ), whatever they were measured as
      const dpBar = num(d.flowDpBar);
      const atRefDp = dpBar !== undefined && dpBar > 0 && type.waterDpBar > 0 ? { dpBar, refDpBar: type.waterDpBar } : {};
      const norm = (v: number | undefined) => {
        if (v === undefined || !(v > 0)) return v;
        const housingEq = num(d.housingEquivalents);
        const own = cartridge.lengthIn ? cartridge.lengthIn / 10 : undefined;
        const byHousing = d.flowBasis === 'housing' && housingEq !== undefined && own !== undefined;
        try {
          return normalisedWaterFlowLh({
            flowLh: v,
            basis: byHousing ? 'housing' : 'cartridge',
            cartridgeEquivalents: own,
            housingEquivalents: housingEq,
            waterTempC: num(d.waterTempC),
            ...atRefDp,
          });
        } catch {
          return v;
        }
      };
      cycles.push({
        kind: d.kind as CareCycleKind,
        tempC: num(d.tempC),
        durationMin: num(d.durationMin),
        agent: typeof d.agent === 'string' ? d.agent : undefined,
        waterFlowBeforeLh: norm(num(d.waterFlowBeforeLh)),
        waterFlowAfterLh: norm(num(d.waterFlowAfterLh)),
        atMs: e.at.getTime(),
        aboveRating: d.aboveRating === true,
      });
    } else if (e.kind === 'integrity' && typeof d.pass === 'boolean' && d.retest !== true) {
      // a product-wet fail that asks for a water re-test is not a verdict on the membrane
      integrity.push({ pass: d.pass, atMs: e.at.getTime() });
    } else if (e.kind === 'registered' && num(d.waterFlowNewLh) !== undefined && (d.waterFlowNewLh as number) > 0) {
      waterFlowNewLh = d.waterFlowNewLh as number;
    }
  }
  // without an as-new flow, the type's clean-water spec for this length (at its reference ΔP and 20 °C)
  if (waterFlowNewLh === undefined && cartridge.lengthIn && type.waterFlowLhPer10in > 0) {
    waterFlowNewLh = (type.waterFlowLhPer10in * cartridge.lengthIn) / 10;
  }
  // The pace of care so far, for a date estimate: cycles per week between the first and the latest cycle.
  let cyclesPerWeek: number | undefined;
  if (cycles.length >= 2) {
    const weeks = ((cycles[cycles.length - 1].atMs as number) - (cycles[0].atMs as number)) / (7 * 86_400_000);
    if (weeks > 0) cyclesPerWeek = (cycles.length - 1) / weeks;
  }
  try {
    const life = forecast(
      {
        ratedSteamCycles: type.ratedSteamCycles ?? undefined,
        ratedHotWaterCycles: type.ratedHotWaterCycles ?? undefined,
        ratedChemicalCycles: type.ratedChemicalCycles ?? undefined,
        flowRecoveryMinPct: type.flowRecoveryMinPct,
      },
      { litresFiltered: Math.max(0, cartridge.litresFiltered), cycles, integrity, waterFlowNewLh },
      { cyclesPerWeek, nowMs: cyclesPerWeek ? now.getTime() : undefined },
    );
    return { life, error: null };
  } catch (error) {
    if (error instanceof RangeError) return { life: null, error: error.message };
    throw error;
  }
}

const emptyFigure = (): StockFigure => ({ count: 0, elementEquivalents: 0 });
const statusKey = { 'in-stock': 'inStock', installed: 'installed', regenerating: 'regenerating', retired: 'retired' } as const;

export function createCartridgesService(db: Database) {
  const repo = createCartridgesRepository(db);

  async function dto(repository: CartridgesRepository, wineryId: string, id: string): Promise<CartridgeDto> {
    const row = await repository.listRow(wineryId, id);
    if (!row) throw notFound('Cartridge');
    return presentCartridge(row);
  }

  /** Runs a move on a locked cartridge of this winery; 404 when it is not one. */
  async function move<T>(tenant: TenantContext, id: string, action: AuditAction, fn: (tx: CartridgesRepository, c: CartridgeRow) => Promise<T>) {
    return db.transaction(async (tx) => {
      const txRepo = createCartridgesRepository(tx);
      const cartridge = await txRepo.byId(tenant.wineryId, id, { lock: true });
      if (!cartridge) throw notFound('Cartridge');
      await audited(tx, tenant, { action, kind: 'cartridge', id }, () => fn(txRepo, cartridge));
      return dto(txRepo, tenant.wineryId, id);
    });
  }

  return {
    /** One page of the inventory with the type and housing names. */
    async list(tenant: TenantContext, query: CartridgeListQuery): Promise<ListDto<CartridgeDto>> {
      const { items, total } = await repo.list(tenant.wineryId, query);
      return { items: items.map(presentCartridge), total };
    },

    /** Per type: count and 10-inch equivalents in stock, installed, regenerating and retired. */
    async summary(tenant: TenantContext): Promise<CartridgeSummaryDto> {
      const groups = await repo.stockGroups(tenant.wineryId);
      const byType = new Map<string, CartridgeStockRowDto>();
      const totals = { inStock: emptyFigure(), installed: emptyFigure(), regenerating: emptyFigure(), retired: emptyFigure() };
      for (const g of groups) {
        let row = byType.get(g.typeId);
        if (!row) {
          row = { typeId: g.typeId, typeName: g.typeName, kind: g.kind, ratingUm: g.ratingUm, inStock: emptyFigure(), installed: emptyFigure(), regenerating: emptyFigure(), retired: emptyFigure() };
          byType.set(g.typeId, row);
        }
        if (!g.status || g.lengthIn === null || g.count === 0) continue;
        const key = statusKey[g.status];
        const eq = elementEquivalents(g.lengthIn, g.count);
        row[key].count += g.count;
        row[key].elementEquivalents += eq;
        totals[key].count += g.count;
        totals[key].elementEquivalents += eq;
      }
      return { types: [...byType.values()], totals };
    },

    /** A cartridge with its history (newest first) and the engine's life forecast. */
    async detail(tenant: TenantContext, id: string, now = new Date()): Promise<CartridgeDetailDto> {
      const cartridge = await repo.byId(tenant.wineryId, id);
      if (!cartridge) throw notFound('Cartridge');
      const [row, type, events] = await Promise.all([
        repo.listRow(tenant.wineryId, id),
        repo.type(tenant.wineryId, cartridge.typeId),
        repo.events(tenant.wineryId, id),
      ]);
      if (!row || !type) throw notFound('Cartridge');
      const { life, error } = lifeFromHistory(type, cartridge, events, now);
      return {
        ...presentCartridge(row),
        ratings: {
          ratedSteamCycles: type.ratedSteamCycles,
          ratedHotWaterCycles: type.ratedHotWaterCycles,
          ratedChemicalCycles: type.ratedChemicalCycles,
          flowRecoveryMinPct: type.flowRecoveryMinPct,
          maxTempC: type.maxTempC,
          bubblePointMinBar: type.bubblePointMinBar,
          media: type.media,
        },
        events: events.map(presentEvent),
        life,
        lifeError: error,
      };
    },

    /** Registers one cartridge in stock, with a 'registered' event. */
    async register(tenant: TenantContext, input: CreateCartridgeInput): Promise<CartridgeDto> {
      try {
        return await db.transaction(async (tx) => {
          const txRepo = createCartridgesRepository(tx);
          if (!(await txRepo.type(tenant.wineryId, input.typeId))) {
            throw badRequest('Check the highlighted fields.', { typeId: 'Choose a cartridge type from this winery\u2019s catalogue.' });
          }
          if (await txRepo.serialTaken(tenant.wineryId, input.serial)) throw duplicateSerial(input.serial);
          const [row] = await txRepo.insertMany([
            {
              wineryId: tenant.wineryId,
              serial: input.serial,
              batch: input.batch,
              typeId: input.typeId,
              lengthIn: input.lengthIn,
              status: 'in-stock',
              receivedAt: input.receivedAt ?? null,
              notes: input.notes,
            },
          ]);
          await txRepo.insertEvents([
            { wineryId: tenant.wineryId, cartridgeId: row.id, kind: 'registered', actorId: tenant.userId, details: { source: 'form', batch: input.batch, receivedAt: input.receivedAt ?? null } },
          ]);
          await recordChange(tx, tenant, { action: 'register', kind: 'cartridge', id: row.id });
          return dto(txRepo, tenant.wineryId, row.id);
        });
      } catch (error) {
        if (isUniqueViolation(error, SERIAL_CONSTRAINT)) throw duplicateSerial(input.serial);
        throw error;
      }
    },

    /** Edits batch, received date and notes; the counters and status change only through moves and history. */
    async update(tenant: TenantContext, id: string, input: UpdateCartridgeInput): Promise<CartridgeDto> {
      return move(tenant, id, 'update', async (txRepo, c) => {
        const changes: Partial<CartridgeRow> = {};
        if (input.batch !== undefined) changes.batch = input.batch;
        if (input.notes !== undefined) changes.notes = input.notes;
        if (input.receivedAt !== undefined) changes.receivedAt = input.receivedAt;
        if (Object.keys(changes).length) {
          await txRepo.update(tenant.wineryId, c.id, changes);
          await txRepo.insertEvents([{ wineryId: tenant.wineryId, cartridgeId: c.id, kind: 'note', actorId: tenant.userId, details: { edited: Object.keys(changes) } }]);
        }
      });
    },

    /**
     * Puts a cartridge into a round of a housing. The housing row is locked for the
     * transaction so two installs cannot both take its last round. A cartridge already in a
     * housing is moved (a 'removed' event for the old round, then 'installed').
     */
    async install(tenant: TenantContext, id: string, input: InstallCartridgeInput): Promise<CartridgeDto> {
      return move(tenant, id, 'install', (txRepo, c) => installCartridge(txRepo, tenant, c, input));
    },

    /** Takes a cartridge out of its housing (or back from regeneration) into stock. */
    async remove(tenant: TenantContext, id: string): Promise<CartridgeDto> {
      return move(tenant, id, 'remove', (txRepo, c) => removeCartridge(txRepo, tenant, c));
    },

    /** Retires a cartridge for good, with the reason; takes it out of its housing. */
    async retire(tenant: TenantContext, id: string, input: RetireCartridgeInput): Promise<CartridgeDto> {
      return move(tenant, id, 'retire', async (txRepo, c) => {
        if (c.status === 'retired') throw conflict(`${c.serial} is already retired.`, 'already_retired');
        await txRepo.update(tenant.wineryId, c.id, { status: 'retired', housingId: null, position: null, retiredReason: input.reason });
        await txRepo.insertEvents([
          { wineryId: tenant.wineryId, cartridgeId: c.id, kind: 'retired', housingId: c.housingId, position: c.position, actorId: tenant.userId, details: { reason: input.reason, from: c.status } },
        ]);
      });
    },

    /** Deletes a cartridge registered by mistake; one that was ever used or cared for is in a record (409 in_record). */
    async deleteUnused(tenant: TenantContext, id: string) {
      await db.transaction(async (tx) => {
        const txRepo = createCartridgesRepository(tx);
        const c = await txRepo.byId(tenant.wineryId, id, { lock: true });
        if (!c) throw notFound('Cartridge');
        await refuseIfInRecord(tx, 'cartridges', tenant.wineryId, id);
        if (c.status === 'installed') throw conflict(`${c.serial} is installed. Take it out before deleting it.`, 'cartridge_installed');
        await deleteBareCartridge(tx, tenant.wineryId, id);
      });
    },

    /** Every housing with its rounds and which cartridge sits in each. */
    async housingView(tenant: TenantContext): Promise<HousingViewDto> {
      const [housings, installed] = await Promise.all([repo.housings(tenant.wineryId), repo.installed(tenant.wineryId)]);
      return {
        housings: housings.map((h) => {
          const here = installed.filter((c) => c.housingId === h.id);
          const positions = Array.from({ length: h.rounds }, (_, i) => {
            const c = here.find((x) => x.position === i + 1);
            return { position: i + 1, cartridge: c ? presentSlotCartridge(c) : null };
          });
          return {
            id: h.id,
            name: h.name,
            rounds: h.rounds,
            lengthIn: h.lengthIn,
            maxPressureBar: h.maxPressureBar,
            maxTempC: h.maxTempC,
            installedCount: here.length,
            freeRounds: Math.max(0, h.rounds - here.length),
            positions,
          };
        }),
      };
    },

    /** Checks a delivery file row by row; saves nothing. */
    async previewImport(tenant: TenantContext, csv: string): Promise<ImportPreviewDto> {
      return checkRows(repo, tenant, csv);
    },

    /** Registers every row of a delivery file in one transaction, or none (400 with the rows' errors). */
    async importDelivery(tenant: TenantContext, csv: string): Promise<ImportResultDto> {
      try {
        return await db.transaction(async (tx) => {
          const txRepo = createCartridgesRepository(tx);
          const preview = await checkRows(txRepo, tenant, csv);
          if (!preview.valid) {
            const fields: Record<string, string> = {};
            for (const r of preview.rows) if (r.errors.length) fields[`line.${r.line}`] = r.errors.join(' ');
            throw new HttpError(
              400,
              'invalid_rows',
              `${preview.errorCount} of ${preview.rows.length} rows need fixing; nothing was imported. Correct the file and upload it again.`,
              fields,
            );
          }
          const rows = await txRepo.insertMany(
            preview.rows.map((r) => ({
              wineryId: tenant.wineryId,
              serial: r.serial,
              batch: r.batch,
              typeId: r.typeId as string,
              lengthIn: r.lengthIn as number,
              status: 'in-stock' as const,
              receivedAt: r.receivedAt,
            })),
          );
          const at = new Date();
          await txRepo.insertEvents(
            rows.map((row) => ({ wineryId: tenant.wineryId, cartridgeId: row.id, kind: 'registered' as const, actorId: tenant.userId, at, details: { source: 'import', batch: row.batch, receivedAt: row.receivedAt } })),
          );
          await recordCreated(tx, tenant, 'import', 'cartridge', rows.map((r) => ({ id: r.id, label: r.serial, values: r })));
          return { imported: rows.length, cartridgeIds: rows.map((r) => r.id) };
        });
      } catch (error) {
        if (isUniqueViolation(error, SERIAL_CONSTRAINT)) {
          throw conflict('Another import registered some of these serials a moment ago. Check the file again.', 'duplicate_serial');
        }
        throw error;
      }
    },
  };
}

/**
 * Puts a locked cartridge into a round of a housing, inside the caller's transaction (the
 * housing row is locked so two installs cannot both take its last round). A cartridge already
 * in a housing is moved (a 'removed' event for the old round, then 'installed'). Runs use it
 * for a change during a run, so the cartridge's history stays one story.
 */
export async function installCartridge(txRepo: CartridgesRepository, tenant: TenantContext, c: CartridgeRow, input: InstallCartridgeInput) {
    const housing = await txRepo.lockHousing(tenant.wineryId, input.housingId);
    if (!housing) throw notFound('Housing');
    if (c.status === 'retired') throw conflict(`${c.serial} is retired and cannot be installed again.`, 'retired');
    if (c.lengthIn !== housing.lengthIn) {
      throw conflict(`${c.serial} is ${c.lengthIn} inches long; ${housing.name} takes ${housing.lengthIn}-inch cartridges.`, 'length_mismatch');
    }
    if (input.position !== undefined && input.position > housing.rounds) {
      throw badRequest('Check the highlighted fields.', { position: `${housing.name} has rounds 1 to ${housing.rounds}.` });
    }
    const others = (await txRepo.installedIn(tenant.wineryId, housing.id)).filter((o) => o.id !== c.id);
    if (others.length >= housing.rounds) {
      throw conflict(`${housing.name} is full: all ${housing.rounds} rounds hold a cartridge. Remove one first.`, 'housing_full');
    }
    const taken = new Set(others.map((o) => o.position));
    let position = input.position;
    if (position === undefined) {
      position = Array.from({ length: housing.rounds }, (_, i) => i + 1).find((p) => !taken.has(p));
      if (position === undefined) throw conflict(`${housing.name} has no free round.`, 'housing_full');
    } else if (taken.has(position)) {
      throw conflict(`Round ${position} of ${housing.name} already holds a cartridge. Choose a free round.`, 'position_taken');
    }
    if (c.housingId === housing.id && c.position === position && c.status === 'installed') {
      throw conflict(`${c.serial} is already in round ${position} of ${housing.name}.`, 'already_installed');
    }
    const now = new Date();
    if (c.status === 'installed' && c.housingId) {
      await txRepo.insertEvents([
        { wineryId: tenant.wineryId, cartridgeId: c.id, kind: 'removed', housingId: c.housingId, position: c.position, actorId: tenant.userId, actorName: tenant.userName ?? null, at: now, details: { movedTo: housing.id } },
      ]);
    }
    await txRepo.update(tenant.wineryId, c.id, { status: 'installed', housingId: housing.id, position });
    await txRepo.insertEvents([
      // One millisecond later, so the timeline orders the pair of a move.
      { wineryId: tenant.wineryId, cartridgeId: c.id, kind: 'installed', housingId: housing.id, position, actorId: tenant.userId, actorName: tenant.userName ?? null, at: new Date(now.getTime() + 1), details: { from: c.status } },
    ]);
}

/**
 * Cartridge moves for another module's write (a change during a run), inside its transaction:
 * `lock` reads and locks a cartridge of the winery; `install` and `remove` write its history.
 */
export function cartridgeMovesIn(tx: DbOrTx, tenant: TenantContext) {
  const repo = createCartridgesRepository(tx);
  return {
    lock: (id: string) => repo.byId(tenant.wineryId, id, { lock: true }),
    install: (c: CartridgeRow, input: InstallCartridgeInput) => installCartridge(repo, tenant, c, input),
    remove: (c: CartridgeRow) => removeCartridge(repo, tenant, c),
  };
}

/** Takes a locked cartridge out of its housing (or back from regeneration) into stock, inside the caller's transaction. */
export async function removeCartridge(txRepo: CartridgesRepository, tenant: TenantContext, c: CartridgeRow) {
    if (c.status === 'retired') throw conflict(`${c.serial} is retired.`, 'retired');
    if (c.status === 'in-stock') throw conflict(`${c.serial} is already in stock.`, 'already_in_stock');
    await txRepo.update(tenant.wineryId, c.id, { status: 'in-stock', housingId: null, position: null });
    await txRepo.insertEvents([
      { wineryId: tenant.wineryId, cartridgeId: c.id, kind: 'removed', housingId: c.housingId, position: c.position, actorId: tenant.userId, actorName: tenant.userName ?? null, details: { from: c.status } },
    ]);
}

async function checkRows(repository: CartridgesRepository, tenant: TenantContext, csv: string) {
  const rows = parseDeliveryCsv(csv);
  const [types, existingSerials] = await Promise.all([
    repository.typeNames(tenant.wineryId),
    repository.existingSerials(
      tenant.wineryId,
      [...new Set(rows.map((r) => (r.values.serial ?? '').trim()).filter(Boolean))],
    ),
  ]);
  const typesByName = new Map(types.map((t) => [t.name.trim().toLowerCase(), t]));
  return checkDeliveryRows(rows, { typesByName, existingSerials });
}

export type CartridgesService = ReturnType<typeof createCartridgesService>;
