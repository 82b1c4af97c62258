import type { CartridgeLife } from '../engine';
import type { CartridgeEventKind, CartridgeLengthIn, CartridgeStatus } from '../schemas/cartridges';

/** One physical cartridge, as listed in the inventory. */
export type CartridgeDto = {
  id: string;
  serial: string;
  batch: string;
  typeId: string;
  typeName: string;
  typeKind: 'prefilter' | 'membrane';
  ratingUm: number;
  lengthIn: CartridgeLengthIn;
  /** 10-inch element equivalents of this cartridge (lengthIn / 10). */
  elementEquivalents: number;
  status: CartridgeStatus;
  housingId: string | null;
  housingName: string | null;
  position: number | null;
  /** YYYY-MM-DD, or null when not recorded. */
  receivedAt: string | null;
  /** Derived from the history; read-only. */
  litresFiltered: number;
  steamCycles: number;
  hotWaterCycles: number;
  chemicalCycles: number;
  retiredReason: string | null;
  notes: string;
  createdAt: string;
  updatedAt: string;
  /** Set when archived: hidden from lists unless `?archived=true`, still in every record. */
  archivedAt: string | null;
};

/** One entry of a cartridge's history. */
export type CartridgeEventDto = {
  id: string;
  kind: CartridgeEventKind;
  at: string;
  /** Who did it (name), or null when the person's account is gone. */
  actorName: string | null;
  housingId: string | null;
  housingName: string | null;
  position: number | null;
  details: Record<string, unknown>;
};

/** Ratings of the cartridge's type used by the life forecast. */
export type CartridgeTypeRatingsDto = {
  ratedSteamCycles: number | null;
  ratedHotWaterCycles: number | null;
  ratedChemicalCycles: number | null;
  flowRecoveryMinPct: number;
  maxTempC: number;
  bubblePointMinBar: number | null;
  media: string;
};

export type CartridgeDetailDto = CartridgeDto & {
  ratings: CartridgeTypeRatingsDto;
  /** Newest first. */
  events: CartridgeEventDto[];
  /** The engine's life forecast from the type's ratings and this history (planning estimate). */
  life: CartridgeLife | null;
  /** Why no forecast could be made, when life is null. */
  lifeError: string | null;
};

export type StockFigure = { count: number; elementEquivalents: number };

export type CartridgeStockRowDto = {
  typeId: string;
  typeName: string;
  kind: 'prefilter' | 'membrane';
  ratingUm: number;
  inStock: StockFigure;
  installed: StockFigure;
  regenerating: StockFigure;
  retired: StockFigure;
};

export type CartridgeSummaryDto = {
  types: CartridgeStockRowDto[];
  totals: { inStock: StockFigure; installed: StockFigure; regenerating: StockFigure; retired: StockFigure };
};

export type HousingSlotCartridgeDto = { id: string; serial: string; batch: string; typeName: string; lengthIn: number; status: CartridgeStatus };

export type HousingViewHousingDto = {
  id: string;
  name: string;
  rounds: number;
  lengthIn: number;
  maxPressureBar: number;
  maxTempC: number;
  installedCount: number;
  freeRounds: number;
  /** One entry per round, 1..rounds. */
  positions: { position: number; cartridge: HousingSlotCartridgeDto | null }[];
};

export type HousingViewDto = { housings: HousingViewHousingDto[] };

export type ImportPreviewRowDto = {
  /** Line in the file (the header is line 1). */
  line: number;
  serial: string;
  batch: string;
  type: string;
  typeId: string | null;
  lengthIn: number | null;
  receivedAt: string | null;
  errors: string[];
};

export type ImportPreviewDto = {
  rows: ImportPreviewRowDto[];
  /** True when every row may be imported. */
  valid: boolean;
  /** Rows with at least one error. */
  errorCount: number;
  /** Problems with the file itself (no rows, missing columns). */
  fileErrors: string[];
};

export type ImportResultDto = { imported: number; cartridgeIds: string[] };
