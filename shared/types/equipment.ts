import type { CartridgeKind, CartridgeMedia, CartridgeTypeWarning, HousingLengthIn } from '../schemas/equipment';

/** A housing, with its derived figures. Pressures bar gauge, temperatures °C, volumes L. */
export type HousingDto = {
  id: string;
  name: string;
  rounds: number;
  lengthIn: HousingLengthIn;
  maxPressureBar: number;
  maxTempC: number;
  holdUpL: number;
  upstreamGasVolumeL: number | null;
  notes: string;
  /** rounds × lengthIn / 10. */
  elementEquivalents: number;
  /** Cartridges whose status is installed in this housing now. */
  installedCount: number;
  createdAt: string;
  updatedAt: string;
  /** Set when archived: hidden from lists unless `?archived=true`, still in every record. */
  archivedAt: string | null;
};

/** A bottling line, with the flow it asks of the filters. */
export type LineDto = {
  id: string;
  name: string;
  bottlesPerHour: number;
  bottleMl: number;
  notes: string;
  /** What the filler draws, L/h. */
  fillerFlowLh: number;
  /** What the filters must carry with the default margin, L/h. */
  requiredFlowLh: number;
  /** The default margin used, %. */
  flowMarginPct: number;
  createdAt: string;
  updatedAt: string;
};

/** How many cartridges of a type the winery has, by status. */
export type CartridgeTypeCountsDto = { total: number; inStock: number; installed: number; regenerating: number; retired: number };

/** One entry of the winery's cartridge catalogue. Values per 10-inch module; bar, °C, L/h, m². */
export type CartridgeTypeDto = {
  id: string;
  name: string;
  kind: CartridgeKind;
  media: CartridgeMedia;
  ratingUm: number;
  areaM2Per10in: number;
  waterFlowLhPer10in: number;
  waterDpBar: number;
  maxDpForwardBar: number;
  /** null when the type may not be backwashed. */
  maxDpReverseBar: number | null;
  maxTempC: number;
  terminalDpBar: number;
  designFluxLhPer10in: number;
  /** The maker's or the winery's usual L/m² to terminal ΔP for an average wine; null when not given. */
  nominalCapacityLPerM2: number | null;
  ratedSteamCycles: number | null;
  ratedHotWaterCycles: number | null;
  ratedChemicalCycles: number | null;
  flowRecoveryMinPct: number;
  bubblePointMinBar: number | null;
  diffusionMaxMlMinPer10in: number | null;
  pricePer10in: number | null;
  currency: string;
  certificateAttachmentId: string | null;
  notes: string;
  /** Clean-water figures per 10-inch module at the spec temperature (null when the spec is incomplete). */
  cleanWater: { resistancePerM: number; specTempC: number; dpBarAtDesignFlux: number | null } | null;
  counts: CartridgeTypeCountsDto;
  /** Accepted but worth a second look (e.g. a membrane without integrity limits). */
  warnings: CartridgeTypeWarning[];
  createdAt: string;
  updatedAt: string;
  /** Set when archived: hidden from lists unless `?archived=true`, still in every record. */
  archivedAt: string | null;
};
