// Response DTO of a winery's hose presets (metric: mm and m; the client converts for display).

export type HosePresetDto = {
  id: string;
  name: string;
  diameterMm: number;
  lengthM: number;
  roughnessMm: number | null;
  sumK: number | null;
  createdByName: string | null;
  createdAt: string;
  updatedAt: string;
};
