import type { CartridgeTypeListQuery, CartridgeTypeSortKey, HousingSortKey, LineSortKey } from '@shared/schemas/equipment';
import type { ListQuery } from '@shared/schemas/list';
import { queryRoots } from '@/lib/query-keys';

export type HousingListParams = ListQuery<HousingSortKey>;
export type LineListParams = ListQuery<LineSortKey>;
export type CartridgeTypeListParams = ListQuery<CartridgeTypeSortKey> & Pick<CartridgeTypeListQuery, 'kind'>;

export const equipmentKeys = {
  all: queryRoots.equipment,
  housings: () => [...equipmentKeys.all, 'housings'] as const,
  housingList: (params: HousingListParams) => [...equipmentKeys.housings(), 'list', params] as const,
  lines: () => [...equipmentKeys.all, 'lines'] as const,
  lineList: (params: LineListParams) => [...equipmentKeys.lines(), 'list', params] as const,
  cartridgeTypes: () => [...equipmentKeys.all, 'cartridge-types'] as const,
  cartridgeTypeList: (params: CartridgeTypeListParams) => [...equipmentKeys.cartridgeTypes(), 'list', params] as const,
  cartridgeType: (id: string) => [...equipmentKeys.cartridgeTypes(), 'detail', id] as const,
};

/** `?q=&sort=&order=&page=&pageSize=` (+ extra filters) for a list request. */
export function listSearch(params: Record<string, string | number | undefined>) {
  const search = new URLSearchParams();
  for (const [k, v] of Object.entries(params)) if (v !== undefined && v !== '') search.set(k, String(v));
  return search.toString();
}
