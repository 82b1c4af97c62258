import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RunStartOptionDto } from '@shared/types/runs';
import { api } from '@/lib/api-client';
import { runKeys } from './keys';

export const getRunStartOptions = () => api.get<{ items: RunStartOptionDto[] }>('/runs/start-options');
export const getRunStartOptionsQueryOptions = () => queryOptions({ queryKey: runKeys.startOptions(), queryFn: getRunStartOptions });
export function useRunStartOptions() {
  return useQuery(getRunStartOptionsQueryOptions());
}
