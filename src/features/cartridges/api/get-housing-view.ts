import { queryOptions, useQuery } from '@tanstack/react-query';
import type { HousingViewDto } from '@shared/types/cartridges';
import { api } from '@/lib/api-client';
import { cartridgeKeys } from './keys';

export const getHousingView = () => api.get<HousingViewDto>('/cartridges/housing-view');

export const getHousingViewQueryOptions = () => queryOptions({ queryKey: cartridgeKeys.housingView(), queryFn: getHousingView });

export function useHousingView() {
  return useQuery(getHousingViewQueryOptions());
}
