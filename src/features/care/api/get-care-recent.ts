import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CareRecentDto } from '@shared/types/care';
import { api } from '@/lib/api-client';
import { careKeys } from './keys';

export const getCareRecent = () => api.get<CareRecentDto>('/care/recent');

export const getCareRecentQueryOptions = () => queryOptions({ queryKey: careKeys.recent(), queryFn: getCareRecent });

export function useCareRecent() {
  return useQuery(getCareRecentQueryOptions());
}
