import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RunDetailDto } from '@shared/types/runs';
import { api } from '@/lib/api-client';
import { runKeys } from './keys';

export const getRun = (id: string) => api.get<RunDetailDto>(`/runs/${encodeURIComponent(id)}`);
export const getRunQueryOptions = (id: string) => queryOptions({ queryKey: runKeys.detail(id), queryFn: () => getRun(id) });
export function useRun(id: string) {
  return useQuery(getRunQueryOptions(id));
}
