import { HOSE_PRESETS_MAX, type HosePresetValues, type UpdateHosePresetInput } from '../../../shared/schemas/hose-presets';
import type { HosePresetDto } from '../../../shared/types/hose-presets';
import type { Database } from '../../db/client';
import { conflict, HttpError, notFound } from '../../lib/errors';
import type { TenantContext } from '../../middleware/authorize';
import { isUniqueViolation } from '../../db/errors';
import { presentHosePreset } from './hose-presets.presenter';
import { createHosePresetsRepository, HOSE_PRESET_NAME_UNIQUE } from './hose-presets.repository';

const nameTaken = () => new HttpError(409, 'hose_preset_name_taken', 'A hose preset with this name already exists.', { name: 'A hose preset with this name already exists; choose another name.' });

async function uniqueName<T>(write: () => Promise<T>): Promise<T> {
  try {
    return await write();
  } catch (error) {
    if (isUniqueViolation(error, HOSE_PRESET_NAME_UNIQUE)) throw nameTaken();
    throw error;
  }
}

/** A winery's usual hoses and lines, saved to pick from on a plan's trains. */
export function createHosePresetsService(db: Database) {
  const repo = createHosePresetsRepository(db);
  return {
    async list(tenant: TenantContext): Promise<HosePresetDto[]> {
      return (await repo.list(tenant.wineryId)).map(presentHosePreset);
    },
    async get(tenant: TenantContext, id: string): Promise<HosePresetDto> {
      const row = await repo.get(tenant.wineryId, id);
      if (!row) throw notFound('Hose preset');
      return presentHosePreset(row);
    },
    async create(tenant: TenantContext, input: HosePresetValues): Promise<HosePresetDto> {
      if ((await repo.count(tenant.wineryId)) >= HOSE_PRESETS_MAX) {
        throw conflict(`A winery keeps at most ${HOSE_PRESETS_MAX} hose presets; delete one you no longer use.`, 'hose_presets_full');
      }
      const row = await uniqueName(() =>
        repo.insert(
          tenant.wineryId,
          { name: input.name, diameterMm: input.diameterMm, lengthM: input.lengthM, roughnessMm: input.roughnessMm ?? null, sumK: input.sumK ?? null },
          { userId: tenant.userId, userName: tenant.userName ?? null },
        ),
      );
      return presentHosePreset(row);
    },
    async update(tenant: TenantContext, id: string, input: UpdateHosePresetInput): Promise<HosePresetDto> {
      const changes: Parameters<typeof repo.update>[2] = {};
      if (input.name !== undefined) changes.name = input.name.trim();
      if (input.diameterMm !== undefined) changes.diameterMm = input.diameterMm;
      if (input.lengthM !== undefined) changes.lengthM = input.lengthM;
      if (input.roughnessMm !== undefined) changes.roughnessMm = input.roughnessMm;
      if (input.sumK !== undefined) changes.sumK = input.sumK;
      const row = await uniqueName(() => repo.update(tenant.wineryId, id, changes));
      if (!row) throw notFound('Hose preset');
      return presentHosePreset(row);
    },
    /** Deletes a preset; trains keep the hose figures they were given (a copy, not a link). */
    async remove(tenant: TenantContext, id: string): Promise<void> {
      if (!(await repo.remove(tenant.wineryId, id))) throw notFound('Hose preset');
    },
  };
}
