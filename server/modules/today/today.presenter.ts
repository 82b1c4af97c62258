import type { CartridgeStockRowDto } from '../../../shared/types/cartridges';
import type { LotListItemDto } from '../../../shared/types/cellar';
import type { PlanDto } from '../../../shared/types/plans';
import type { TodayCartridgeDto, TodayCartridgeFigure, TodayLotDto, TodayPlanDto, TodayStockTypeDto } from '../../../shared/types/today';
import type { LifeInput } from '../cartridges/life-inputs.service';

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
  row: Pick<LifeInput, 'cartridge' | 'housingName'>,
  typeName: string,
  attention: { reason: string; figure: TodayCartridgeFigure; alsoNoted: string[] },
): TodayCartridgeDto => ({
  id: row.cartridge.id,
  serial: row.cartridge.serial,
  typeName,
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

/** A plan's detail cut down to what Today shows of a bottling day ahead. */
export const presentTodayPlan = (plan: PlanDto & { status: TodayPlanDto['status'] }): TodayPlanDto => {
  const lotsWithoutTrain = plan.lots.filter((l) => l.chosenTrainId === null).length;
  return {
    id: plan.id,
    name: plan.name,
    plannedDate: plan.plannedDate,
    status: plan.status,
    line: plan.line ? { id: plan.line.id, name: plan.line.name } : null,
    lotCount: plan.lots.length,
    volumeL: plan.lots.reduce((sum, l) => sum + l.volumeL, 0),
    trainsChosen: plan.lots.length > 0 && lotsWithoutTrain === 0,
    lotsWithoutTrain,
    shortfalls: plan.needs
      .filter((n) => n.verdict === 'short')
      .map((n) => ({ cartridgeTypeId: n.cartridgeTypeId, typeName: n.typeName, kind: n.kind, lengthIn: n.lengthIn, short: n.shortfall })),
  };
};
