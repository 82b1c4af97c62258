import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ListDto } from '@shared/types/api';
import type { LabResultDto } from '@shared/types/cellar';
import { api } from '@/lib/api-client';
import { lotKeys } from './keys';

/** All lab results of a lot, newest sample first. */
export const getLabResults = (lotId: string) => api.get<ListDto<LabResultDto>>(`/lots/${lotId}/lab-results`);

export const getLabResultsQueryOptions = (lotId: string) =>
  queryOptions({ queryKey: lotKeys.labResults(lotId), queryFn: () => getLabResults(lotId) });

export function useLabResults(lotId: string) {
  return useQuery(getLabResultsQueryOptions(lotId));
}
