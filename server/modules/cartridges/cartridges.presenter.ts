import type { CartridgeLengthIn } from '../../../shared/schemas/cartridges';
import type { CartridgeDto, CartridgeEventDto, HousingSlotCartridgeDto } from '../../../shared/types/cartridges';
import type { CartridgeEventRow, CartridgeListRow } from './cartridges.repository';

import { elementEquivalents as engineElementEquivalents } from '../../../shared/engine';

/** 10-inch element equivalents of `count` cartridges of this length (a 30-inch cartridge is 3 modules). */
export const elementEquivalents = (lengthIn: number, count = 1) => engineElementEquivalents({ cartridges: count, lengthIn });

export const presentCartridge = (r: CartridgeListRow): CartridgeDto => ({
  id: r.id,
  serial: r.serial,
  batch: r.batch,
  typeId: r.typeId,
  typeName: r.typeName,
  typeKind: r.typeKind,
  ratingUm: r.ratingUm,
  lengthIn: r.lengthIn as CartridgeLengthIn,
  elementEquivalents: elementEquivalents(r.lengthIn),
  status: r.status,
  housingId: r.housingId,
  housingName: r.housingName ?? null,
  position: r.position,
  receivedAt: r.receivedAt,
  litresFiltered: r.litresFiltered,
  steamCycles: r.steamCycles,
  hotWaterCycles: r.hotWaterCycles,
  chemicalCycles: r.chemicalCycles,
  retiredReason: r.retiredReason,
  notes: r.notes,
  createdAt: r.createdAt.toISOString(),
  updatedAt: r.updatedAt.toISOString(),
  archivedAt: r.archivedAt ? r.archivedAt.toISOString() : null,
});

export const presentEvent = (e: CartridgeEventRow): CartridgeEventDto => ({
  id: e.id,
  kind: e.kind,
  at: e.at.toISOString(),
  actorName: e.actorName ?? null,
  housingId: e.housingId,
  housingName: e.housingName ?? null,
  position: e.position,
  details: e.details ?? {},
});

export const presentSlotCartridge = (c: HousingSlotCartridgeDto): HousingSlotCartridgeDto => ({
  id: c.id,
  serial: c.serial,
  batch: c.batch,
  typeName: c.typeName,
  lengthIn: c.lengthIn,
  status: c.status,
});
