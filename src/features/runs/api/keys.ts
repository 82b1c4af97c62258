import { queryRoots } from '@/lib/query-keys';

export const runKeys = {
  all: queryRoots.runs,
  list: () => [...runKeys.all, 'list'] as const,
  startOptions: () => [...runKeys.all, 'start-options'] as const,
  startCheck: (planLotId: string) => [...runKeys.all, 'start-check', planLotId] as const,
  detail: (id: string) => [...runKeys.all, 'detail', id] as const,
  /** Cartridges in stock for a change during a run: under the cartridges root, so anything that
   * refreshes the cartridge screens refreshes this list too. */
  stockCartridges: () => [...queryRoots.cartridges, 'run-stock'] as const,
};
