import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { alertKeys } from './keys';

export const markNotificationRead = (id: string) => api.post<void>(`/notifications/${id}/read`);

export function useMarkNotificationRead() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: markNotificationRead, onSettled: () => qc.invalidateQueries({ queryKey: alertKeys.all }) });
}
