import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { alertKeys } from './keys';

export const markAllNotificationsRead = () => api.post<{ marked: number }>('/notifications/read-all');

export function useMarkAllNotificationsRead() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: markAllNotificationsRead, onSettled: () => qc.invalidateQueries({ queryKey: alertKeys.all }) });
}
