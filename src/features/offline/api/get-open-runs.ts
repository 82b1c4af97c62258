import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RunSummaryDto } from '@shared/types/runs';
import { api } from '@/lib/api-client';
import { waitingKeys } from './keys';

/** Runs still taking readings: where a refused reading can be moved. */
export const getOpenRuns = async () => (await api.get<{ items: RunSummaryDto[] }>('/runs')).items.filter((r) => r.status === 'running');
export const getOpenRunsQueryOptions = () => queryOptions({ queryKey: waitingKeys.openRuns(), queryFn: getOpenRuns });
export function useOpenRuns(enabled: boolean) {
  return useQuery({ ...getOpenRunsQueryOptions(), enabled });
}
