import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TodayDto } from '@shared/types/today';
import { api } from '@/lib/api-client';
import { todayKeys } from './keys';

export const getToday = () => api.get<TodayDto>('/today');

/** Always fetched afresh on opening: it gathers what other pages change. */
export const getTodayQueryOptions = () => queryOptions({ queryKey: todayKeys.detail(), queryFn: getToday, staleTime: 0 });

export function useToday() {
  return useQuery(getTodayQueryOptions());
}
