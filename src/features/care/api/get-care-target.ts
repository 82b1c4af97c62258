import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CareTargetDto } from '@shared/types/care';
import { api } from '@/lib/api-client';
import { careKeys } from './keys';

export const getCareTarget = (id: string) => api.get<CareTargetDto>(`/care/cartridges/${encodeURIComponent(id)}`);

export const getCareTargetQueryOptions = (id: string) => queryOptions({ queryKey: careKeys.target(id), queryFn: () => getCareTarget(id) });

export function useCareTarget(id: string | null) {
  return useQuery({ ...getCareTargetQueryOptions(id ?? ''), enabled: Boolean(id) });
}
