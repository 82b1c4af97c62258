import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CartridgeSummaryDto } from '@shared/types/cartridges';
import { api } from '@/lib/api-client';
import { cartridgeKeys } from './keys';

export const getCartridgeSummary = () => api.get<CartridgeSummaryDto>('/cartridges/summary');

export const getCartridgeSummaryQueryOptions = () => queryOptions({ queryKey: cartridgeKeys.summary(), queryFn: getCartridgeSummary });

export function useCartridgeSummary() {
  return useQuery(getCartridgeSummaryQueryOptions());
}
