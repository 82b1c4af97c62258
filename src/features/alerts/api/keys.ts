export const alertsKeys = {
  all: ['alerts'] as const,
  notifications: (filter: { unread: boolean; page: number }) => [...alertsKeys.all, 'notifications', filter] as const,
  notificationLists: () => [...alertsKeys.all, 'notifications'] as const,
  unread: () => [...alertsKeys.all, 'unread'] as const,
  preferences: () => [...alertsKeys.all, 'preferences'] as const,
  mailFailures: () => [...alertsKeys.all, 'mail-failures'] as const,
};
