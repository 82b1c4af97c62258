import { queryOptions, useQuery } from '@tanstack/react-query';
import type { LotDto } from '@shared/types/cellar';
import { api } from '@/lib/api-client';
import { lotKeys } from './keys';

export const getLot = (id: string) => api.get<LotDto>(`/lots/${id}`);

export const getLotQueryOptions = (id: string) => queryOptions({ queryKey: lotKeys.detail(id), queryFn: () => getLot(id) });

export function useLot(id: string) {
  return useQuery(getLotQueryOptions(id));
}
