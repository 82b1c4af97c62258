import { queryRoots } from '@/lib/query-keys';

export const alertKeys = {
  all: queryRoots.alerts,
  notifications: (filter: { unread: boolean; page: number }) => [...alertKeys.all, 'notifications', filter] as const,
  notificationLists: () => [...alertKeys.all, 'notifications'] as const,
  unread: () => [...alertKeys.all, 'unread'] as const,
  preferences: () => [...alertKeys.all, 'preferences'] as const,
  mailFailures: () => [...alertKeys.all, 'mail-failures'] as const,
};
