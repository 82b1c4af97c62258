// Porewise's service worker: the app shell, fonts and every route's code are precached, so the
// app opens without a network; page addresses all answer with the cached shell. The outbox is
// sent from here too when the browser fires Background Sync (even with no Porewise tab open).
import { clientsClaim } from 'workbox-core';
import { cleanupOutdatedCaches, createHandlerBoundToURL, precacheAndRoute } from 'workbox-precaching';
import { NavigationRoute, registerRoute } from 'workbox-routing';
import { idbOutboxStorage } from './lib/offline/idb-storage';
import { belongsTo, flush, SendError, type Send } from './lib/offline/outbox';

type ExtendableEvent = Event & { waitUntil(p: Promise<unknown>): void };
type SyncEvent = ExtendableEvent & { tag: string };
type Worker = {
  __WB_MANIFEST: Parameters<typeof precacheAndRoute>[0];
  skipWaiting(): Promise<void>;
  addEventListener(type: 'sync', fn: (e: SyncEvent) => void): void;
  clients: { matchAll(opts?: { type?: string }): Promise<{ postMessage(m: unknown): void }[]> };
};
const sw = self as unknown as Worker;

// Written out in full: the build finds and fills in `self.__WB_MANIFEST` by its text.
precacheAndRoute((self as unknown as Worker).__WB_MANIFEST);
cleanupOutdatedCaches();
registerRoute(new NavigationRoute(createHandlerBoundToURL('/index.html'), { denylist: [/^\/api\//] }));
void sw.skipWaiting();
clientsClaim();

const OUTBOX_SYNC_TAG = 'porewise-outbox';

const send: Send = async (path, body, key) => {
  let res: Response;
  try {
    res = await fetch(`/api${path}`, {
      method: 'POST',
      credentials: 'same-origin',
      headers: { accept: 'application/json', 'content-type': 'application/json', 'idempotency-key': key },
      body: JSON.stringify(body),
    });
  } catch {
    throw new SendError(0, 'offline', 'No answer from Porewise.');
  }
  const data = (await res.json().catch(() => null)) as { error?: { code?: string; message?: string; fields?: Record<string, string> } } | null;
  if (!res.ok) throw new SendError(res.status, data?.error?.code ?? 'http_error', data?.error?.message ?? `The server answered ${String(res.status)}.`, data?.error?.fields ?? {});
  return data;
};

async function syncOutbox() {
  const me = await fetch('/api/me', { credentials: 'same-origin' })
    .then((r) => (r.ok ? (r.json() as Promise<{ user: { id: string }; activeWineryId: string | null }>) : null))
    .catch(() => null);
  if (!me) throw new Error('Porewise cannot be reached or nobody is signed in; the browser will try again.');
  const work = () => flush(idbOutboxStorage(), send, { only: (e) => belongsTo(e, { userId: me.user.id, wineryId: me.activeWineryId }) });
  const locks = (navigator as Navigator & { locks?: LockManager }).locks;
  const outcomes = locks ? await locks.request('porewise-outbox', work) : await work();
  for (const client of await sw.clients.matchAll({ type: 'window' })) client.postMessage('changed');
  // Something still waits for a connection: a rejection asks the browser to fire the sync again.
  if (outcomes.some((o) => o.result === 'waiting')) throw new Error('Entries still waiting.');
}

sw.addEventListener('sync', (event) => {
  if (event.tag === OUTBOX_SYNC_TAG) event.waitUntil(syncOutbox());
});
