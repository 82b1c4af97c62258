import type { HosePresetDto } from '../../../shared/types/hose-presets';
import type { HosePresetRow } from './hose-presets.repository';

export const presentHosePreset = (r: HosePresetRow): HosePresetDto => ({
  id: r.id,
  name: r.name,
  diameterMm: r.diameterMm,
  lengthM: r.lengthM,
  roughnessMm: r.roughnessMm,
  sumK: r.sumK,
  createdByName: r.createdByName,
  createdAt: r.createdAt.toISOString(),
  updatedAt: r.updatedAt.toISOString(),
});
