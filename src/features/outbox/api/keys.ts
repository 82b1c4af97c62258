import { queryRoots } from '@/lib/query-keys';

export const outboxKeys = {
  all: queryRoots.outbox,
  list: (key?: string) => [...outboxKeys.all, 'list', key ?? null] as const,
};
