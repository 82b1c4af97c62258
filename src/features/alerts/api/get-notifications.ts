import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { NotificationsDto } from '@shared/types/alerts';
import { api } from '@/lib/api-client';
import { alertKeys } from './keys';

/** How often the bell asks for new alerts, ms (and whenever the window regains focus). */
export const UNREAD_POLL_MS = 15_000;

export const getNotifications = ({ unread, page }: { unread: boolean; page: number }) =>
  api.get<NotificationsDto>(`/notifications?${new URLSearchParams({ ...(unread ? { unread: 'true' } : {}), page: String(page) })}`);

export const getNotificationsQueryOptions = (filter: { unread: boolean; page: number }) =>
  queryOptions({ queryKey: alertKeys.notifications(filter), queryFn: () => getNotifications(filter), placeholderData: keepPreviousData });

export function useNotifications(filter: { unread: boolean; page: number }) {
  return useQuery({ ...getNotificationsQueryOptions(filter), refetchInterval: UNREAD_POLL_MS });
}

/** The unread count for the bell: the first page of unread alerts, polled. */
export function useUnreadNotifications() {
  return useQuery({ queryKey: alertKeys.unread(), queryFn: () => getNotifications({ unread: true, page: 1 }), refetchInterval: UNREAD_POLL_MS, refetchOnWindowFocus: true });
}
