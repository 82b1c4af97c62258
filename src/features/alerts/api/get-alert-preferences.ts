import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AlertPreferencesDto } from '@shared/types/alerts';
import { api } from '@/lib/api-client';
import { alertKeys } from './keys';

export const getAlertPreferences = () => api.get<AlertPreferencesDto>('/me/alert-preferences');
export const getAlertPreferencesQueryOptions = () => queryOptions({ queryKey: alertKeys.preferences(), queryFn: getAlertPreferences });

export function useAlertPreferences() {
  return useQuery(getAlertPreferencesQueryOptions());
}
