import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ListDto } from '@shared/types/api';
import type { LineDto } from '@shared/types/equipment';
import { api } from '@/lib/api-client';
import { planKeys } from './keys';

/** The winery's bottling lines, to choose the plan's line from. */
export const getLineOptions = () => api.get<ListDto<LineDto>>('/lines?sort=name&pageSize=100');

export const getLineOptionsQueryOptions = () => queryOptions({ queryKey: planKeys.lineOptions(), queryFn: getLineOptions, staleTime: 30_000 });

export function useLineOptions(enabled = true) {
  return useQuery({ ...getLineOptionsQueryOptions(), enabled });
}
