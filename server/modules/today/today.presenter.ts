import type { CartridgeStockRowDto } from '../../../shared/types/cartridges';
import type { LotListItemDto } from '../../../shared/types/cellar';
import type { TodayCartridgeDto, TodayCartridgeFigure, TodayLotDto, TodayStockTypeDto } from '../../../shared/types/today';
import type { TodayCartridgeRow } from './today.repository';

export const presentTodayLot = (lot: LotListItemDto, reason: string): TodayLotDto => ({
  id: lot.id,
  code: lot.code,
  name: lot.name,
  style: lot.style,
  volumeL: lot.volumeL,
  verdict: lot.readiness.verdict,
  reason,
  sampledAt: lot.latest?.sampledAt ?? null,
});

export const presentTodayCartridge = (
  row: TodayCartridgeRow,
  attention: { reason: string; figure: TodayCartridgeFigure; alsoNoted: string[] },
): TodayCartridgeDto => ({
  id: row.cartridge.id,
  serial: row.cartridge.serial,
  typeName: row.type.name,
  status: row.cartridge.status,
  housing: row.cartridge.housingId && row.housingName ? { id: row.cartridge.housingId, name: row.housingName } : null,
  position: row.cartridge.position,
  reason: attention.reason,
  figure: attention.figure,
  alsoNoted: attention.alsoNoted,
});

export const presentStockType = (t: CartridgeStockRowDto): TodayStockTypeDto => ({
  typeId: t.typeId,
  typeName: t.typeName,
  kind: t.kind,
  ratingUm: t.ratingUm,
  inStock: t.inStock,
  installed: t.installed,
  regenerating: t.regenerating,
  shortfall: t.inStock.count === 0,
});
