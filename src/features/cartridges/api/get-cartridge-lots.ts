import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RecordLotListDto } from '@shared/types/records';
import { api } from '@/lib/api-client';
import { cartridgeKeys } from './keys';

/** The bottled lots a cartridge filtered (the records' reverse trace by serial). */
export const getCartridgeLots = (serial: string) => api.get<RecordLotListDto>(`/records/lots?serial=${encodeURIComponent(serial)}&pageSize=100`);
export const getCartridgeLotsQueryOptions = (id: string, serial: string) =>
  queryOptions({ queryKey: [...cartridgeKeys.detail(id), 'lots'] as const, queryFn: () => getCartridgeLots(serial) });
export function useCartridgeLots(id: string, serial: string) {
  return useQuery(getCartridgeLotsQueryOptions(id, serial));
}
