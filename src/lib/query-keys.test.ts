import { describe, expect, it } from 'vitest';
import { careKeys } from '@/features/care/api/keys';
import { cartridgeKeys } from '@/features/cartridges/api/keys';
import { cellarKeys, lotKeys, tankKeys } from '@/features/cellar/api/keys';
import { planKeys } from '@/features/plans/api/keys';
import { runKeys } from '@/features/runs/api/keys';
import { todayKeys } from '@/features/today/api/keys';
import { queryRoots } from './query-keys';

// TanStack Query matches keys by prefix: invalidating a root refreshes everything under it.
const startsWith = (key: readonly unknown[], prefix: readonly unknown[]) => prefix.every((p, i) => key[i] === p);

describe('query keys grow from one root per feature', () => {
  it('every root is its own single word', () => {
    const firsts = Object.values(queryRoots).map((r) => r[0]);
    expect(new Set(firsts).size).toBe(firsts.length);
    for (const r of Object.values(queryRoots)) expect(r).toHaveLength(1);
  });

  it('feature factories start at their roots', () => {
    expect(cartridgeKeys.all).toBe(queryRoots.cartridges);
    expect(todayKeys.all).toBe(queryRoots.today);
    expect(planKeys.all).toBe(queryRoots.plans);
    expect(runKeys.all).toBe(queryRoots.runs);
    expect(careKeys.all).toBe(queryRoots.care);
    expect(cellarKeys.all).toBe(queryRoots.cellar);
  });

  it('keeps the keys the cache held before', () => {
    expect(runKeys.startCheck('p1')).toEqual(['runs', 'start-check', 'p1']);
    expect(runKeys.stockCartridges()).toEqual(['cartridges', 'run-stock']);
    expect(lotKeys.detail('l1')).toEqual(['cellar', 'lots', 'detail', 'l1']);
    expect(lotKeys.labResults('l1')).toEqual(['cellar', 'lots', 'detail', 'l1', 'lab-results']);
    expect(tankKeys.list({})).toEqual(['cellar', 'tanks', 'list', {}]);
  });

  it('refreshing another feature through its root reaches its lists and details', () => {
    expect(startsWith(cartridgeKeys.detail('c1'), queryRoots.cartridges)).toBe(true);
    expect(startsWith(runKeys.stockCartridges(), queryRoots.cartridges)).toBe(true);
    expect(startsWith(todayKeys.detail(), queryRoots.today)).toBe(true);
    expect(startsWith(planKeys.detail('p1'), queryRoots.plans)).toBe(true);
  });
});
