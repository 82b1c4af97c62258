import { queryRoots } from '@/lib/query-keys';

export const winerySettingsKeys = {
  all: queryRoots.winerySettings,
  detail: () => [...winerySettingsKeys.all, 'detail'] as const,
};
