import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ListDto } from '@shared/types/api';
import type { CartridgeDto } from '@shared/types/cartridges';
import { api } from '@/lib/api-client';
import { runKeys } from './keys';

/** Cartridges in stock, to choose what goes in at a change during a run. */
export const getStockCartridges = () => api.get<ListDto<CartridgeDto>>('/cartridges?status=in-stock&pageSize=100&sort=serial');
export const stockCartridgesQueryOptions = () => queryOptions({ queryKey: runKeys.stockCartridges(), queryFn: getStockCartridges });
export function useStockCartridges(enabled: boolean) {
  return useQuery({ ...stockCartridgesQueryOptions(), enabled });
}
