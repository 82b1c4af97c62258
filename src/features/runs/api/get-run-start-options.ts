import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RunStartOptionDto } from '@shared/types/runs';
import { api } from '@/lib/api-client';
import { runsKeys } from './keys';

export const getRunStartOptions = () => api.get<{ items: RunStartOptionDto[] }>('/runs/start-options');
export const getRunStartOptionsQueryOptions = () => queryOptions({ queryKey: runsKeys.startOptions(), queryFn: getRunStartOptions });
export function useRunStartOptions() {
  return useQuery(getRunStartOptionsQueryOptions());
}
