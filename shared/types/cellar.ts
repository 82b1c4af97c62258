// Response DTOs of the cellar (metric/SI values; the client converts for display).
import type { CloggingIndexBand, ReadinessVerdict, WineStyle } from '../engine';

export type TankDto = {
  id: string;
  name: string;
  capacityL: number;
  notes: string;
  /** lots currently in this tank */
  lotCount: number;
  /** total volume of those lots, L */
  lotVolumeL: number;
  createdAt: string;
  updatedAt: string;
};

export type TankRefDto = { id: string; name: string };

export type ReadinessDto = { verdict: ReadinessVerdict; reasons: string[] };

export type CloggingIndexBandDto = {
  /** Romat's interpretation band (0.65 µm disc), for reference. */
  band: CloggingIndexBand;
  label: string;
  /** The verdict against the winery's readiness limits: the same as the lot's readiness says. */
  verdict: 'ready' | 'borderline' | 'not-ready';
  /** A few words for the badge ("above 20 s"). */
  short: string;
  reason: string;
};

/** The Vmax disc test of a lab result, reduced by the constant-pressure fit. */
export type DiscTestDto = {
  diameterMm: number | null;
  pressureBar: number | null;
  points: { timeS: number; volumeMl: number }[];
  /** disc filtration area, m² (null without a diameter) */
  areaM2: number | null;
} & (
  | {
      computable: true;
      /** Vmax of the disc, L */
      vmaxL: number;
      /** Vmax per unit membrane area, L/m² */
      vmaxLPerM2: number;
      /** initial flux, L/m²/h */
      j0LPerM2H: number;
      /** r² of the t/V line */
      r2: number;
    }
  | { computable: false; reason: string }
);

export type LabResultDto = {
  id: string;
  lotId: string;
  sampledAt: string;
  turbidityNtu: number | null;
  t200s: number | null;
  t400s: number | null;
  /** T400 − 2·T200, s (null without both times) */
  cloggingIndex: number | null;
  cloggingIndexBand: CloggingIndexBandDto | null;
  disc: DiscTestDto | null;
  freeSo2MgL: number | null;
  notes: string;
  createdBy: string | null;
  createdAt: string;
  updatedAt: string;
};

/** What the lots table and the lot page both say first about a lot. */
export type LotHeadDto = {
  id: string;
  code: string;
  name: string;
  style: WineStyle;
  vintage: number | null;
  volumeL: number;
  tank: TankRefDto | null;
};

/** One row of the lots table: the lot with a summary of its latest lab result. */
export type LotListItemDto = LotHeadDto & {
  latest: {
    sampledAt: string;
    turbidityNtu: number | null;
    cloggingIndex: number | null;
    cloggingIndexBand: CloggingIndexBandDto | null;
  } | null;
  readiness: ReadinessDto;
};

/** The thresholds a lot's verdict was judged against (the winery's own or the defaults). */
export type ReadinessThresholdsUsedDto = {
  isDefault: boolean;
  turbidity: { limitNtu: number; borderlineMarginNtu: number; source: string };
  cloggingIndex: { readyMaxS: number; borderlineMaxS: number; source: string };
  cloggingIndexValidity: { validBelowNtu: number; source: string };
  vmax: { readyMinSafetyFactor: number; borderlineMinSafetyFactor: number; source: string };
};

export type LotDto = LotHeadDto & {
  ethanolPctVol: number;
  sugarGPerL: number;
  tempC: number;
  notes: string;
  createdAt: string;
  updatedAt: string;
  /** Set when archived: hidden from lists unless `?archived=true`, still in every record. */
  archivedAt: string | null;
  labResultCount: number;
  latestLabResult: LabResultDto | null;
  readiness: ReadinessDto;
  thresholds: ReadinessThresholdsUsedDto;
};
