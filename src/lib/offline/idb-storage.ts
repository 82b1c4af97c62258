// The outbox kept in IndexedDB (survives a reload, a closed tab and a restarted phone).
// Used by the page and by the service worker.
import { createStore, del, set, values } from 'idb-keyval';
import { bySeq, memoryStorage, type OutboxEntry, type OutboxStorage } from './outbox';

export const OUTBOX_DB = 'porewise-outbox';

export function idbOutboxStorage(): OutboxStorage {
  if (typeof indexedDB === 'undefined') return memoryStorage();
  const store = createStore(OUTBOX_DB, 'entries');
  return {
    getAll: async () => (await values<OutboxEntry>(store)).sort(bySeq),
    put: (entry) => set(entry.id, entry, store),
    delete: (id) => del(id, store),
  };
}
