import type { CartridgeSortKey, CartridgeStatus } from '@shared/schemas/cartridges';
import { queryRoots } from '@/lib/query-keys';

/** Filters of the inventory list, as sent to GET /api/cartridges. */
export type CartridgeFilters = {
  q?: string;
  status?: CartridgeStatus;
  typeId?: string;
  housingId?: string;
  batch?: string;
  lengthIn?: number;
  sort?: CartridgeSortKey;
  order?: 'asc' | 'desc';
  page?: number;
  pageSize?: number;
  /** 'true' lists archived cartridges too. */
  archived?: 'true';
};

export const cartridgeKeys = {
  all: queryRoots.cartridges,
  lists: () => [...cartridgeKeys.all, 'list'] as const,
  list: (filters: CartridgeFilters) => [...cartridgeKeys.lists(), filters] as const,
  summary: () => [...cartridgeKeys.all, 'summary'] as const,
  housingView: () => [...cartridgeKeys.all, 'housing-view'] as const,
  details: () => [...cartridgeKeys.all, 'detail'] as const,
  detail: (id: string) => [...cartridgeKeys.details(), id] as const,
};
