import { queryRoots } from '@/lib/query-keys';

export const todayKeys = {
  all: queryRoots.today,
  detail: () => [...todayKeys.all, 'detail'] as const,
};
