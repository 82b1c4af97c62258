// The outbox: writes made on a phone in the cellar are kept on the device first and sent to the
// server in the order they were made, when there is a connection. Each entry carries its own
// key (the reading's clientKey or the request's Idempotency-Key), so sending it again after a
// lost answer never stores it twice. Entries the server refuses stay, with its reason, until
// the person fixes, moves or discards them: nothing is dropped silently.
//
// Pure logic over an injected storage and an injected sender, so it runs the same in the page,
// in the service worker (Background Sync) and in tests.

/** What an entry is. Readings of the same run are sent together through the batch endpoint. */
export type OutboxKind = 'reading' | 'care-cycle' | 'integrity-test';

export type OutboxRefusal = { status: number; code: string; message: string; fields: Record<string, string> };

export type OutboxEntry = {
  /** The entry's key: a reading's clientKey, or the Idempotency-Key of the request. */
  id: string;
  kind: OutboxKind;
  /** Order of making; entries are sent in this order. */
  seq: number;
  /** API path without the /api prefix, e.g. /runs/<id>/readings. */
  path: string;
  body: Record<string, unknown>;
  /** For readings: the run they belong to (batched per run). */
  runId?: string;
  /** What a person reads in the list of waiting entries. */
  label: string;
  createdAt: string;
  /** The winery the entry was made in and who made it: it is only sent while they are signed in there. */
  wineryId: string | null;
  userId: string | null;
  status: 'waiting' | 'refused';
  refusal?: OutboxRefusal;
  attempts: number;
  /** Query keys to refresh once it is stored. */
  invalidate: unknown[][];
};

/** Where entries are kept: IndexedDB in the browser, a Map in tests. */
export interface OutboxStorage {
  getAll(): Promise<OutboxEntry[]>;
  put(entry: OutboxEntry): Promise<void>;
  delete(id: string): Promise<void>;
}

/** An error answer (or no answer: status 0) from the server. */
export class SendError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: Record<string, string> = {},
  ) {
    super(message);
  }
}

/** POSTs `body` to `path` with the Idempotency-Key `key`; throws SendError. */
export type Send = (path: string, body: unknown, key: string) => Promise<unknown>;

export type Outcome =
  | { id: string; result: 'stored'; answer: unknown }
  | { id: string; result: 'refused'; refusal: OutboxRefusal }
  | { id: string; result: 'waiting' };

/** Readings per batch request (the server's limit). */
export const OUTBOX_BATCH_MAX = 1000;

export const bySeq = (a: OutboxEntry, b: OutboxEntry) => a.seq - b.seq;

/** A refusal is the server's answer about this entry; anything else (no answer, 5xx, signed out) is worth retrying. */
function isRefusal(e: unknown): e is SendError {
  return e instanceof SendError && e.status >= 400 && e.status < 500 && e.status !== 401 && e.status !== 408 && e.status !== 429 && e.code !== 'request_in_progress';
}

function refusalOf(e: SendError, fieldPrefix?: string): OutboxRefusal {
  const fields: Record<string, string> = {};
  for (const [k, v] of Object.entries(e.fields)) {
    if (!fieldPrefix) fields[k] = v;
    else if (k.startsWith(fieldPrefix)) fields[k.slice(fieldPrefix.length)] = v;
  }
  return { status: e.status, code: e.code, message: e.message, fields };
}

/** Groups the waiting entries into sends: consecutive readings of one run go in one batch. */
export function plan(entries: OutboxEntry[]): OutboxEntry[][] {
  const groups: OutboxEntry[][] = [];
  for (const e of [...entries].filter((x) => x.status === 'waiting').sort(bySeq)) {
    const last = groups[groups.length - 1];
    if (e.kind === 'reading' && last && last[0].kind === 'reading' && last[0].runId === e.runId && last.length < OUTBOX_BATCH_MAX) last.push(e);
    else groups.push([e]);
  }
  return groups;
}

/**
 * Sends every waiting entry in order. Stops at the first entry that gets no answer (offline,
 * server trouble), so later entries never overtake it. A batch the server refuses is sent again
 * one reading at a time, so each reading gets its own answer (stored, or refused with a reason).
 * `only` limits sending to the entries of the active winery.
 */
export async function flush(storage: OutboxStorage, send: Send, opts: { only?: (e: OutboxEntry) => boolean } = {}): Promise<Outcome[]> {
  const outcomes: Outcome[] = [];
  const all = (await storage.getAll()).filter((e) => !opts.only || opts.only(e));
  const groups = plan(all);
  const mark = async (e: OutboxEntry, err: SendError, prefix?: string) => {
    const refusal = refusalOf(err, prefix);
    await storage.put({ ...e, status: 'refused', refusal, attempts: e.attempts + 1 });
    outcomes.push({ id: e.id, result: 'refused', refusal });
  };
  const one = async (e: OutboxEntry, path = e.path): Promise<boolean> => {
    try {
      const answer = await send(path, e.body, e.id);
      await storage.delete(e.id);
      outcomes.push({ id: e.id, result: 'stored', answer });
      return true;
    } catch (err) {
      if (isRefusal(err)) {
        await mark(e, err);
        return true;
      }
      await storage.put({ ...e, attempts: e.attempts + 1 });
      return false;
    }
  };
  for (let g = 0; g < groups.length; g++) {
    const group = groups[g];
    let ok: boolean;
    if (group.length === 1) {
      // One reading alone asks for its stage's new figures, so the page need not reload the run.
      ok = await one(group[0], group[0].kind === 'reading' ? `${group[0].path}?with=stage` : group[0].path);
    } else {
      try {
        const answer = await send(`/runs/${encodeURIComponent(group[0].runId ?? '')}/readings/batch`, { readings: group.map((e) => e.body) }, `batch-${group[0].id}-${String(group.length)}`);
        for (const e of group) {
          await storage.delete(e.id);
          outcomes.push({ id: e.id, result: 'stored', answer });
        }
        ok = true;
      } catch (err) {
        if (!isRefusal(err)) {
          for (const e of group) await storage.put({ ...e, attempts: e.attempts + 1 });
          ok = false;
        } else {
          ok = true;
          for (const e of group) {
            if (!(await one(e))) {
              ok = false;
              break;
            }
          }
        }
      }
    }
    if (!ok) {
      for (const rest of groups.slice(g).flat()) if (!outcomes.some((o) => o.id === rest.id)) outcomes.push({ id: rest.id, result: 'waiting' });
      break;
    }
  }
  return outcomes;
}

/** Whether an entry may be sent for this signed-in person and active winery. */
export function belongsTo(e: OutboxEntry, who: { userId: string | null; wineryId: string | null }) {
  return who.userId !== null && e.userId === who.userId && e.wineryId === who.wineryId;
}

/** A Map-backed storage (tests, and browsers without IndexedDB). */
export function memoryStorage(initial: OutboxEntry[] = []): OutboxStorage & { map: Map<string, OutboxEntry> } {
  const map = new Map(initial.map((e) => [e.id, e]));
  return {
    map,
    getAll: async () => [...map.values()].sort(bySeq),
    put: async (e) => {
      map.set(e.id, structuredClone(e));
    },
    delete: async (id) => {
      map.delete(id);
    },
  };
}

/** A random key (getRandomValues also works on plain-HTTP LAN addresses, unlike randomUUID). */
export function newKey() {
  return Array.from(crypto.getRandomValues(new Uint8Array(16)), (b) => b.toString(16).padStart(2, '0')).join('');
}
