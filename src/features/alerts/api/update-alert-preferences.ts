import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AlertPreferencesInput } from '@shared/schemas/alerts';
import type { AlertPreferencesDto } from '@shared/types/alerts';
import { api } from '@/lib/api-client';
import { alertKeys } from './keys';

export const updateAlertPreferences = (input: AlertPreferencesInput) => api.patch<AlertPreferencesDto>('/me/alert-preferences', input);

export function useUpdateAlertPreferences() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: updateAlertPreferences, onSuccess: (data) => qc.setQueryData(alertKeys.preferences(), data) });
}
