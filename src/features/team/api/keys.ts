import { queryRoots } from '@/lib/query-keys';

export const teamKeys = {
  all: queryRoots.team,
  detail: () => [...teamKeys.all, 'detail'] as const,
};
