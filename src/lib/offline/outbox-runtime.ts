// The page's outbox: one per tab, over IndexedDB. Features add entries through `submit`
// (kept first, then sent at once when there is a connection); the shell shows how many wait.
// Sending happens in order, one flush at a time across tabs (Web Locks), when the app opens,
// when the connection returns, every little while while entries wait, and through Background
// Sync in the service worker where the browser has it.
import type { QueryClient } from '@tanstack/react-query';
import { useMemo, useSyncExternalStore } from 'react';
import type { MeDto } from '@shared/types/api';
import { api, ApiError } from '../api-client';
import { sessionKeys, useMe } from '../session';
import { idbOutboxStorage } from './idb-storage';
import { belongsTo, flush, newKey, SendError, type Outcome, type OutboxEntry, type OutboxKind, type OutboxStorage, type Send } from './outbox';

export { newKey };
export type { OutboxEntry, Outcome };

export const OUTBOX_SYNC_TAG = 'porewise-outbox';
const RETRY_EVERY_MS = 20_000;

type StoredHandler = (entry: OutboxEntry, answer: unknown, qc: QueryClient) => void;

let storage: OutboxStorage | null = null;
let queryClient: QueryClient | null = null;
let entries: OutboxEntry[] = [];
let lastSeq = 0;
let running: Promise<Outcome[]> | null = null;
let timer: ReturnType<typeof setInterval> | null = null;
const listeners = new Set<() => void>();
const handlers = new Map<OutboxKind, StoredHandler>();
const channel = typeof BroadcastChannel === 'undefined' ? null : new BroadcastChannel('porewise-outbox');

function store() {
  storage ??= idbOutboxStorage();
  return storage;
}

/** Tests may run the runtime over their own storage. */
export function useOutboxStorageForTests(s: OutboxStorage) {
  storage = s;
}

const sendWithApi: Send = async (path, body, key) => {
  try {
    return await api.post<unknown>(path, body, { idempotencyKey: key });
  } catch (e) {
    if (e instanceof ApiError) throw new SendError(e.status, e.code, e.message, e.fields);
    throw new SendError(0, 'offline', 'No answer from Porewise.');
  }
};

async function reload() {
  entries = await store().getAll();
  for (const l of listeners) l();
}

function who() {
  const me = queryClient?.getQueryData<MeDto | null>(sessionKeys.me());
  return { userId: me?.user.id ?? null, wineryId: me?.activeWineryId ?? null };
}

/** A feature's way to update its cache from the server's answer to one of its entries. */
export function onEntryStored(kind: OutboxKind, handler: StoredHandler) {
  handlers.set(kind, handler);
}

/** Sends what waits, once at a time (also across tabs). */
export function flushOutbox(): Promise<Outcome[]> {
  running ??= (async () => {
    try {
      const work = async () => {
        const current = who();
        return flush(store(), sendWithApi, { only: (e) => belongsTo(e, current) });
      };
      const locks = typeof navigator !== 'undefined' ? (navigator as Navigator & { locks?: LockManager }).locks : undefined;
      const outcomes = locks ? ((await locks.request('porewise-outbox', work)) as Outcome[]) : await work();
      const before = entries;
      await reload();
      const qc = queryClient;
      if (qc) {
        for (const o of outcomes) {
          if (o.result !== 'stored') continue;
          const entry = before.find((e) => e.id === o.id);
          if (!entry) continue;
          handlers.get(entry.kind)?.(entry, o.answer, qc);
          for (const key of entry.invalidate) void qc.invalidateQueries({ queryKey: key });
        }
      }
      if (outcomes.length > 0) channel?.postMessage('changed');
      return outcomes;
    } finally {
      running = null;
    }
  })();
  return running;
}

export type NewEntry = Pick<OutboxEntry, 'kind' | 'path' | 'body' | 'label' | 'invalidate'> & { id?: string; runId?: string };

async function add(e: NewEntry): Promise<OutboxEntry> {
  lastSeq = Math.max(Date.now(), lastSeq + 1);
  const entry: OutboxEntry = {
    id: e.id ?? newKey(),
    kind: e.kind,
    seq: lastSeq,
    path: e.path,
    body: e.body,
    ...(e.runId ? { runId: e.runId } : {}),
    label: e.label,
    createdAt: new Date().toISOString(),
    ...who(),
    status: 'waiting',
    attempts: 0,
    invalidate: e.invalidate,
  };
  await store().put(entry);
  await reload();
  requestBackgroundSync();
  return entry;
}

/**
 * Keeps the entry on the device, then tries to send it (with everything waiting before it).
 * 'stored' with the server's answer; 'waiting' when there is no connection (it stays kept);
 * 'refused' when the server said no — then the entry is taken back out, so the person who is
 * still at the form corrects it there.
 */
export async function submit(e: NewEntry): Promise<Outcome> {
  const entry = await add(e);
  if (typeof navigator !== 'undefined' && navigator.onLine === false) return { id: entry.id, result: 'waiting' };
  if (running) await running;
  const outcomes = await flushOutbox();
  const mine = outcomes.find((o) => o.id === entry.id) ?? { id: entry.id, result: 'waiting' as const };
  if (mine.result === 'refused') await discard(entry.id);
  return mine;
}

export async function discard(id: string) {
  await store().delete(id);
  await reload();
  channel?.postMessage('changed');
}

/** Puts a refused entry back in line with changed values (fix) or a new place (move). */
export async function resend(id: string, change: { body?: Record<string, unknown>; path?: string; runId?: string; label?: string }) {
  const e = entries.find((x) => x.id === id);
  if (!e) return;
  const { refusal: _gone, ...rest } = e;
  await store().put({ ...rest, ...change, body: change.body ?? e.body, status: 'waiting' });
  await reload();
  void flushOutbox();
}

export function outboxEntries() {
  return entries;
}

function requestBackgroundSync() {
  if (typeof navigator === 'undefined' || !('serviceWorker' in navigator)) return;
  void navigator.serviceWorker.ready
    .then((reg) => (reg as ServiceWorkerRegistration & { sync?: { register(tag: string): Promise<void> } }).sync?.register(OUTBOX_SYNC_TAG))
    .catch(() => {});
}

/** Starts the outbox for this tab: loads what waits and sends it, then keeps trying. */
export function startOutbox(qc: QueryClient) {
  queryClient = qc;
  void reload().then(() => {
    lastSeq = Math.max(lastSeq, ...entries.map((e) => e.seq));
    if (entries.some((e) => e.status === 'waiting')) void flushOutbox();
  });
  if (typeof window === 'undefined') return () => {};
  const onOnline = () => void flushOutbox();
  const onVisible = () => {
    if (document.visibilityState === 'visible' && entries.some((e) => e.status === 'waiting')) void flushOutbox();
  };
  const onMessage = () => void reload();
  window.addEventListener('online', onOnline);
  document.addEventListener('visibilitychange', onVisible);
  channel?.addEventListener('message', onMessage);
  navigator.serviceWorker?.addEventListener('message', onMessage);
  timer = setInterval(() => {
    if (navigator.onLine && entries.some((e) => e.status === 'waiting')) void flushOutbox();
  }, RETRY_EVERY_MS);
  return () => {
    window.removeEventListener('online', onOnline);
    document.removeEventListener('visibilitychange', onVisible);
    channel?.removeEventListener('message', onMessage);
    navigator.serviceWorker?.removeEventListener('message', onMessage);
    if (timer) clearInterval(timer);
  };
}

function subscribe(l: () => void) {
  listeners.add(l);
  return () => {
    listeners.delete(l);
  };
}

/** Every kept entry (waiting and refused), oldest first; re-renders when it changes. */
export function useAllOutboxEntries(): OutboxEntry[] {
  return useSyncExternalStore(subscribe, outboxEntries, outboxEntries);
}

/** The signed-in person's entries in the active winery, oldest first. */
export function useOutbox(): OutboxEntry[] {
  const all = useAllOutboxEntries();
  const me = useMe().data;
  const current = { userId: me?.user.id ?? null, wineryId: me?.activeWineryId ?? null };
  return useMemo(() => all.filter((e) => belongsTo(e, current)), [all, current.userId, current.wineryId]);
}
