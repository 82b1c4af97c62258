import { queryRoots } from '@/lib/query-keys';

export const runKeys = {
  all: queryRoots.runs,
  list: () => [...runKeys.all, 'list'] as const,
  startOptions: () => [...runKeys.all, 'start-options'] as const,
  startCheck: (planLotId: string) => [...runKeys.all, 'start-check', planLotId] as const,
  detail: (id: string) => [...runKeys.all, 'detail', id] as const,
  /** Every page of a run's readings (one stage, or 'all'); refreshed when a reading is stored, corrected or voided. */
  readings: (id: string) => [...runKeys.all, 'readings', id] as const,
  readingsPage: (id: string, stage: number | 'all', page: number, pageSize: number) => [...runKeys.readings(id), stage, page, pageSize] as const,
  /** Cartridges in stock for a change during a run: under the cartridges root, so anything that
   * refreshes the cartridge screens refreshes this list too. */
  stockCartridges: () => [...queryRoots.cartridges, 'run-stock'] as const,
};
