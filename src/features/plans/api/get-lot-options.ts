import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ListDto } from '@shared/types/api';
import type { LotListItemDto } from '@shared/types/cellar';
import { api } from '@/lib/api-client';
import { planKeys } from './keys';

/** The cellar's lots with their readiness, to add to a plan. */
export const getLotOptions = () => api.get<ListDto<LotListItemDto>>('/lots?sort=code&pageSize=100');

export const getLotOptionsQueryOptions = () => queryOptions({ queryKey: planKeys.lotOptions(), queryFn: getLotOptions, staleTime: 30_000 });

export function useLotOptions(enabled = true) {
  return useQuery({ ...getLotOptionsQueryOptions(), enabled });
}
