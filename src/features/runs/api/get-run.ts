import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RunDetailDto } from '@shared/types/runs';
import { api } from '@/lib/api-client';
import { runsKeys } from './keys';

export const getRun = (id: string) => api.get<RunDetailDto>(`/runs/${encodeURIComponent(id)}`);
export const getRunQueryOptions = (id: string) => queryOptions({ queryKey: runsKeys.detail(id), queryFn: () => getRun(id) });
export function useRun(id: string) {
  return useQuery(getRunQueryOptions(id));
}
