import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListDto } from '@shared/types/api';
import type { CartridgeTypeDto } from '@shared/types/equipment';
import { api } from '@/lib/api-client';
import { equipmentKeys, listSearch, type CartridgeTypeListParams } from './keys';

export const getCartridgeTypes = (params: CartridgeTypeListParams) => api.get<ListDto<CartridgeTypeDto>>(`/cartridge-types?${listSearch(params)}`);

export const getCartridgeTypesQueryOptions = (params: CartridgeTypeListParams) =>
  queryOptions({ queryKey: equipmentKeys.cartridgeTypeList(params), queryFn: () => getCartridgeTypes(params), placeholderData: keepPreviousData });

export function useCartridgeTypes(params: CartridgeTypeListParams) {
  return useQuery(getCartridgeTypesQueryOptions(params));
}
