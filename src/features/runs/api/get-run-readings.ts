import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import type { ListDto } from '@shared/types/api';
import type { RunReadingDto } from '@shared/types/runs';
import { api } from '@/lib/api-client';
import { runKeys } from './keys';

/** One page of a run's stored readings, newest first (one stage, or every stage when `stage` is 'all'). */
export const getRunReadings = (runId: string, stage: number | 'all', page: number, pageSize: number) => {
  const q = new URLSearchParams({ page: String(page), pageSize: String(pageSize) });
  if (stage !== 'all') q.set('stage', String(stage));
  return api.get<ListDto<RunReadingDto>>(`/runs/${encodeURIComponent(runId)}/readings?${q.toString()}`);
};
export const runReadingsQueryOptions = (runId: string, stage: number | 'all', page: number, pageSize: number) =>
  queryOptions({ queryKey: runKeys.readingsPage(runId, stage, page, pageSize), queryFn: () => getRunReadings(runId, stage, page, pageSize) });
/** Keeps the page shown while the next one loads, so the table does not jump. */
export function useRunReadings(runId: string, stage: number | 'all', page: number, pageSize: number) {
  return useQuery({ ...runReadingsQueryOptions(runId, stage, page, pageSize), placeholderData: keepPreviousData });
}

/** The page of readings shown (from 1), its query, and how many readings and pages there are. */
export function useRunReadingPages(runId: string, stage: number | 'all', pageSize: number) {
  const [page, setPage] = useState(1);
  const stored = useRunReadings(runId, stage, page, pageSize);
  const total = stored.data?.total ?? 0;
  return { stored, page, setPage, total, pages: Math.max(1, Math.ceil(total / pageSize)) };
}
