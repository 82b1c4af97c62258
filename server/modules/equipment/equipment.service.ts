import {
  createCartridgeTypeInputSchema,
  createHousingInputSchema,
  createLineInputSchema,
  type CartridgeTypeListQuery,
  type CartridgeTypeValues,
  type HousingSortKey,
  type HousingValues,
  type LineSortKey,
  type LineValues,
  type UpdateCartridgeTypeInput,
  type UpdateHousingInput,
  type UpdateLineInput,
} from '../../../shared/schemas/equipment';
import type { ListQuery } from '../../../shared/schemas/list';
import type { ListDto } from '../../../shared/types/api';
import type { CartridgeTypeDto, HousingDto, LineDto } from '../../../shared/types/equipment';
import type { Database } from '../../db/client';
import { isUniqueViolation } from '../../db/errors';
import { badRequest, conflict, HttpError, inRecord, notFound } from '../../lib/errors';
import { recordHolder, refuseIfInRecord } from '../archive/archive.service';
import type { TenantContext } from '../../middleware/authorize';
import { parseOrThrow } from '../../middleware/validate';
import { presentCartridgeType, presentHousing, presentLine } from './equipment.presenter';
import { createEquipmentRepository, type CartridgeTypeRow, type HousingRow, type LineRow } from './equipment.repository';
import { audited } from '../audit/audit.service';

const nameTaken = (what: string, name: string) => {
  const message = `There is already a ${what} called "${name}" in this winery. Choose another name.`;
  return new HttpError(409, 'name_taken', message, { name: message });
};

/** Runs a write; a duplicate name becomes a 409 with the message on the name field. */
async function uniqueName<T>(what: string, name: string | undefined, write: () => Promise<T>): Promise<T> {
  try {
    return await write();
  } catch (error) {
    if (isUniqueViolation(error)) throw nameTaken(what, name ?? '');
    throw error;
  }
}

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** The stored fields of a row, in the shape the create schema checks (for merged PATCH checks). */
const housingValues = (h: HousingRow): HousingValues => ({
  name: h.name,
  rounds: h.rounds,
  lengthIn: h.lengthIn as HousingValues['lengthIn'],
  maxPressureBar: h.maxPressureBar,
  maxTempC: h.maxTempC,
  holdUpL: h.holdUpL,
  upstreamGasVolumeL: h.upstreamGasVolumeL,
  notes: h.notes,
});
const lineValues = (l: LineRow): LineValues => ({ name: l.name, bottlesPerHour: l.bottlesPerHour, bottleMl: l.bottleMl, notes: l.notes });
const cartridgeTypeValues = (t: CartridgeTypeRow): CartridgeTypeValues => {
  const { id: _id, wineryId: _w, createdAt: _c, updatedAt: _u, ...values } = t;
  return values;
};

/**
 * Housings, bottling lines and the winery's cartridge-type catalogue. Every read and write
 * is scoped to the tenant's winery; another winery's record is "not found".
 */
export function createEquipmentService(db: Database) {
  const repo = createEquipmentRepository(db);

  async function housing(tenant: TenantContext, id: string): Promise<HousingDto> {
    const row = await repo.housing(tenant.wineryId, id);
    if (!row) throw notFound('Housing');
    return presentHousing(row);
  }

  async function line(tenant: TenantContext, id: string): Promise<LineDto> {
    const row = await repo.line(tenant.wineryId, id);
    if (!row) throw notFound('Bottling line');
    return presentLine(row);
  }

  async function cartridgeType(tenant: TenantContext, id: string): Promise<CartridgeTypeDto> {
    const row = await repo.cartridgeType(tenant.wineryId, id);
    if (!row) throw notFound('Cartridge type');
    return presentCartridgeType(row);
  }

  /** A certificate must be one of the winery's own attachments. */
  async function checkCertificate(tenant: TenantContext, attachmentId: string | null | undefined) {
    if (!attachmentId) return;
    if (!(await repo.attachmentExists(tenant.wineryId, attachmentId))) {
      throw badRequest('Check the highlighted fields.', { certificateAttachmentId: 'That certificate is not among this winery’s attachments. Upload it again.' });
    }
  }

  return {
    // ---- housings -------------------------------------------------------------------
    async listHousings(tenant: TenantContext, query: ListQuery<HousingSortKey>): Promise<ListDto<HousingDto>> {
      const { rows, total } = await repo.listHousings(tenant.wineryId, query);
      return { items: rows.map(presentHousing), total };
    },
    housing,
    async createHousing(tenant: TenantContext, input: HousingValues): Promise<HousingDto> {
      const id = await uniqueName('housing', input.name, () =>
        audited(db, tenant, { action: 'create', kind: 'housing' }, (tx) => createEquipmentRepository(tx).insertHousing({ ...input, wineryId: tenant.wineryId })),
      );
      return housing(tenant, id);
    },
    /**
     * Changes a housing. The merged record is checked as a whole; rounds may not drop below the
     * cartridges installed, and the cartridge length may not change while any are installed.
     */
    async updateHousing(tenant: TenantContext, id: string, input: UpdateHousingInput): Promise<HousingDto> {
      await db.transaction(async (tx) => {
        const txRepo = createEquipmentRepository(tx);
        if (!(await txRepo.lockHousing(tenant.wineryId, id))) throw notFound('Housing');
        const current = (await txRepo.housing(tenant.wineryId, id))!;
        const merged = parseOrThrow(createHousingInputSchema, { ...housingValues(current.housing), ...input });
        const installed = current.installedCount;
        if (installed > 0 && merged.lengthIn !== current.housing.lengthIn) {
          throw conflict(
            `${plural(installed, 'cartridge is', 'cartridges are')} installed in this housing. Remove them before changing the cartridge length.`,
            'cartridges_installed',
          );
        }
        const highestRound = await txRepo.highestUsedRound(tenant.wineryId, id);
        if (merged.rounds < highestRound) {
          throw conflict(`Round ${highestRound} holds a cartridge. Move or remove it before cutting the housing to ${merged.rounds} rounds.`, 'cartridges_installed');
        }
        if (merged.rounds < installed) {
          throw conflict(
            `${plural(installed, 'cartridge is', 'cartridges are')} installed in this housing, more than ${merged.rounds} rounds. Remove some first.`,
            'cartridges_installed',
          );
        }
        await uniqueName('housing', merged.name, () => audited(tx, tenant, { action: 'update', kind: 'housing', id }, () => txRepo.updateHousing(tenant.wineryId, id, merged)));
      });
      return housing(tenant, id);
    },
    /** Deletes a housing that holds no cartridges and that no cartridge history names. */
    async deleteHousing(tenant: TenantContext, id: string) {
      await db.transaction(async (tx) => {
        const txRepo = createEquipmentRepository(tx);
        if (!(await txRepo.lockHousing(tenant.wineryId, id))) throw notFound('Housing');
        await refuseIfInRecord(tx, 'housings', tenant.wineryId, id);
        const inside = await txRepo.cartridgesInHousing(tenant.wineryId, id);
        if (inside > 0) {
          throw conflict(
            `${plural(inside, 'cartridge is', 'cartridges are')} installed in this housing. Remove them before deleting it.`,
            'cartridges_installed',
          );
        }
        const events = await txRepo.historyEventsForHousing(tenant.wineryId, id);
        if (events > 0) {
          throw inRecord(`Cartridge history refers to this housing (${plural(events, 'event', 'events')}), so it stays for the records. Archive it instead.`, {
            kind: 'cartridge-history',
            id,
            label: 'cartridge history',
          });
        }
        await audited(tx, tenant, { action: 'delete', kind: 'housing', id }, () => txRepo.deleteHousing(tenant.wineryId, id));
      });
    },

    // ---- bottling lines -------------------------------------------------------------
    async listLines(tenant: TenantContext, query: ListQuery<LineSortKey>): Promise<ListDto<LineDto>> {
      const { rows, total } = await repo.listLines(tenant.wineryId, query);
      return { items: rows.map(presentLine), total };
    },
    line,
    async createLine(tenant: TenantContext, input: LineValues): Promise<LineDto> {
      const row = await uniqueName('bottling line', input.name, () =>
        audited<LineRow>(db, tenant, { action: 'create', kind: 'line', idOf: (r) => r.id }, (tx) => createEquipmentRepository(tx).insertLine({ ...input, wineryId: tenant.wineryId })),
      );
      return presentLine(row);
    },
    async updateLine(tenant: TenantContext, id: string, input: UpdateLineInput): Promise<LineDto> {
      const current = await repo.line(tenant.wineryId, id);
      if (!current) throw notFound('Bottling line');
      const merged = parseOrThrow(createLineInputSchema, { ...lineValues(current), ...input });
      const row = await uniqueName('bottling line', merged.name, () =>
        audited(db, tenant, { action: 'update', kind: 'line', id }, (tx) => createEquipmentRepository(tx).updateLine(tenant.wineryId, id, merged)),
      );
      if (!row) throw notFound('Bottling line');
      return presentLine(row);
    },
    async deleteLine(tenant: TenantContext, id: string) {
      if (!(await audited(db, tenant, { action: 'delete', kind: 'line', id }, (tx) => createEquipmentRepository(tx).deleteLine(tenant.wineryId, id)))) throw notFound('Bottling line');
    },

    // ---- cartridge types ------------------------------------------------------------
    async listCartridgeTypes(tenant: TenantContext, query: CartridgeTypeListQuery): Promise<ListDto<CartridgeTypeDto>> {
      const { rows, total } = await repo.listCartridgeTypes(tenant.wineryId, query);
      return { items: rows.map(presentCartridgeType), total };
    },
    cartridgeType,
    async createCartridgeType(tenant: TenantContext, input: CartridgeTypeValues): Promise<CartridgeTypeDto> {
      await checkCertificate(tenant, input.certificateAttachmentId);
      const id = await uniqueName('cartridge type', input.name, () =>
        audited(db, tenant, { action: 'create', kind: 'cartridge-type' }, (tx) => createEquipmentRepository(tx).insertCartridgeType({ ...input, wineryId: tenant.wineryId })),
      );
      return cartridgeType(tenant, id);
    },
    async updateCartridgeType(tenant: TenantContext, id: string, input: UpdateCartridgeTypeInput): Promise<CartridgeTypeDto> {
      const current = await repo.cartridgeType(tenant.wineryId, id);
      if (!current) throw notFound('Cartridge type');
      const merged = parseOrThrow(createCartridgeTypeInputSchema, { ...cartridgeTypeValues(current.type), ...input });
      if (merged.certificateAttachmentId !== current.type.certificateAttachmentId) await checkCertificate(tenant, merged.certificateAttachmentId);
      const updated = await uniqueName('cartridge type', merged.name, () =>
        audited(db, tenant, { action: 'update', kind: 'cartridge-type', id }, (tx) => createEquipmentRepository(tx).updateCartridgeType(tenant.wineryId, id, merged)),
      );
      if (!updated) throw notFound('Cartridge type');
      return cartridgeType(tenant, id);
    },
    /** Deletes a type no cartridge belongs to (the cartridges' history names their type). */
    async deleteCartridgeType(tenant: TenantContext, id: string) {
      await db.transaction(async (tx) => {
        const txRepo = createEquipmentRepository(tx);
        if (!(await txRepo.lockCartridgeType(tenant.wineryId, id))) throw notFound('Cartridge type');
        const holder = await recordHolder(tx, 'cartridge-types', tenant.wineryId, id);
        if (holder?.kind === 'run') await refuseIfInRecord(tx, 'cartridge-types', tenant.wineryId, id);
        const n = await txRepo.cartridgesOfType(tenant.wineryId, id);
        if (n > 0 && holder) {
          throw inRecord(
            `${plural(n, 'cartridge is', 'cartridges are')} of this type, and their records name it. It cannot be deleted; archive it instead when it is no longer bought.`,
            holder,
          );
        }
        await audited(tx, tenant, { action: 'delete', kind: 'cartridge-type', id }, () => txRepo.deleteCartridgeType(tenant.wineryId, id));
      });
    },
  };
}

export type EquipmentService = ReturnType<typeof createEquipmentService>;
