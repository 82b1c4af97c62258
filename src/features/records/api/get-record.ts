import { queryOptions, useQuery } from '@tanstack/react-query';
import type { FilterRecordDto } from '@shared/types/records';
import { api } from '@/lib/api-client';
import { recordKeys } from './keys';

export const getRecord = (lotId: string) => api.get<FilterRecordDto>(`/records/lots/${encodeURIComponent(lotId)}`);
export const getRecordQueryOptions = (lotId: string) => queryOptions({ queryKey: recordKeys.detail(lotId), queryFn: () => getRecord(lotId) });
export function useRecord(lotId: string) {
  return useQuery(getRecordQueryOptions(lotId));
}

/** Where the server makes the record's files (same origin: the session cookie goes along). */
export const recordPdfUrl = (lotId: string, paper: 'a4' | 'letter') => `/api/records/lots/${encodeURIComponent(lotId)}/pdf?paper=${paper}`;
export const recordCsvUrl = (lotId: string) => `/api/records/lots/${encodeURIComponent(lotId)}/csv`;
