import { queryRoots } from '@/lib/query-keys';

/** The Waiting page: what the device still holds and where a refused reading can go. */
export const waitingKeys = {
  all: queryRoots.waiting,
  openRuns: () => [...waitingKeys.all, 'open-runs'] as const,
};
