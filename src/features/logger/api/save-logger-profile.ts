import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LoggerProfileInput, LoggerProfilePatch } from '@shared/schemas/logger';
import type { LoggerProfileDto } from '@shared/types/logger';
import { api } from '@/lib/api-client';
import { loggerKeys } from './keys';

export const createLoggerProfile = (input: LoggerProfileInput) => api.post<LoggerProfileDto>('/logger-profiles', input);
export const updateLoggerProfile = ({ id, patch }: { id: string; patch: LoggerProfilePatch }) => api.patch<LoggerProfileDto>(`/logger-profiles/${encodeURIComponent(id)}`, patch);
export const deleteLoggerProfile = (id: string) => api.delete<void>(`/logger-profiles/${encodeURIComponent(id)}`);

export function useCreateLoggerProfile() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createLoggerProfile, onSuccess: () => qc.invalidateQueries({ queryKey: loggerKeys.all }) });
}
export function useUpdateLoggerProfile() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: updateLoggerProfile, onSuccess: () => qc.invalidateQueries({ queryKey: loggerKeys.all }) });
}
export function useDeleteLoggerProfile() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: deleteLoggerProfile, onSuccess: () => qc.invalidateQueries({ queryKey: loggerKeys.all }) });
}
