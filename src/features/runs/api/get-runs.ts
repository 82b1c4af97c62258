import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RunSummaryDto } from '@shared/types/runs';
import { api } from '@/lib/api-client';
import { runKeys } from './keys';

export const getRuns = () => api.get<{ items: RunSummaryDto[]; total: number }>('/runs');
export const getRunsQueryOptions = () => queryOptions({ queryKey: runKeys.list(), queryFn: getRuns });
export function useRuns() {
  return useQuery(getRunsQueryOptions());
}
