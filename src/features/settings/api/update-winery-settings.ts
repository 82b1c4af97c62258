import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UpdateWinerySettingsInput } from '@shared/schemas/winery-settings';
import type { WinerySettingsDto } from '@shared/types/api';
import { api } from '@/lib/api-client';
import { sessionKeys } from '@/lib/session';
import { winerySettingsKeys } from './keys';

export const updateWinerySettings = (input: UpdateWinerySettingsInput) => api.patch<WinerySettingsDto>('/settings/winery', input);

export function useUpdateWinerySettings() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updateWinerySettings,
    onSuccess: (settings) => {
      qc.setQueryData(winerySettingsKeys.detail(), settings);
      // Readiness verdicts and the winery name shown elsewhere depend on these settings.
      void qc.invalidateQueries({ predicate: (q) => q.queryKey[0] !== winerySettingsKeys.all[0] });
      void qc.invalidateQueries({ queryKey: sessionKeys.me() });
    },
  });
}
