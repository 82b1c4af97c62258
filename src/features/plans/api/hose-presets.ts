import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { CreateHosePresetInput } from '@shared/schemas/hose-presets';
import type { HosePresetDto } from '@shared/types/hose-presets';
import { api } from '@/lib/api-client';

/** Query keys of the winery's hose presets. */
export const hosePresetKeys = { all: ['hose-presets'] as const };

/** The winery's hose presets, by name. */
export const getHosePresets = () => api.get<{ items: HosePresetDto[] }>('/hose-presets');

export const getHosePresetsQueryOptions = () => queryOptions({ queryKey: hosePresetKeys.all, queryFn: getHosePresets, staleTime: 30_000 });

export function useHosePresets(enabled = true) {
  return useQuery({ ...getHosePresetsQueryOptions(), enabled });
}

export const createHosePreset = (input: CreateHosePresetInput) => api.post<HosePresetDto>('/hose-presets', input);

/** Saves a hose as a preset; the list is fetched again. */
export function useCreateHosePreset() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createHosePreset, onSuccess: () => qc.invalidateQueries({ queryKey: hosePresetKeys.all }) });
}
