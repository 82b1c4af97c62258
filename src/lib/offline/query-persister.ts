// The TanStack Query cache kept in IndexedDB (idb-keyval), restored when the app opens.
import { createAsyncStoragePersister } from '@tanstack/query-async-storage-persister';
import { createStore, del, get, set } from 'idb-keyval';

/** Kept data older than this is not shown (a week: a bottling campaign's pause). */
export const CACHE_MAX_AGE_MS = 7 * 24 * 60 * 60 * 1000;

const CACHE_KEY = 'porewise-query-cache';
const keptStore = () => (typeof indexedDB === 'undefined' ? undefined : createStore('porewise-cache', 'queries'));

/** Sign-out: no answer of the winery stays on the device (entries waiting to send are kept apart). */
export async function forgetKeptAnswers() {
  const store = keptStore();
  if (store) await del(CACHE_KEY, store);
}

export function createCachePersister() {
  const store = keptStore();
  return createAsyncStoragePersister({
    storage: store
      ? {
          getItem: (key: string) => get<string>(key, store).then((v) => v ?? null),
          setItem: (key: string, value: string) => set(key, value, store),
          removeItem: (key: string) => del(key, store),
        }
      : undefined,
    key: CACHE_KEY,
    throttleTime: 1000,
  });
}
