import { queryRoots } from '@/lib/query-keys';
export const careKeys = {
  all: queryRoots.care,
  recent: () => [...careKeys.all, 'recent'] as const,
  targets: () => [...careKeys.all, 'target'] as const,
  target: (id: string) => [...careKeys.targets(), id] as const,
  search: (q: string) => [...careKeys.all, 'search', q] as const,
};
