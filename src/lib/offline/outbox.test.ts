import { describe, expect, it } from 'vitest';
import { belongsTo, flush, memoryStorage, OUTBOX_BATCH_MAX, plan, SendError, type OutboxEntry, type Send } from './outbox';

let seq = 0;
function entry(over: Partial<OutboxEntry> = {}): OutboxEntry {
  seq += 1;
  const id = over.id ?? `k${String(seq)}`;
  return {
    id,
    kind: 'reading',
    seq,
    path: '/runs/r1/readings',
    body: { clientKey: id, stageIndex: 0, volumeL: seq * 10, upstreamBar: 2, downstreamBar: 1.9 },
    runId: 'r1',
    label: `Reading ${id}`,
    createdAt: new Date(0).toISOString(),
    wineryId: 'w1',
    userId: 'u1',
    status: 'waiting',
    attempts: 0,
    invalidate: [],
    ...over,
  };
}

/** A stand-in server: stores by key (a resend stores nothing twice), refuses what `refuse` says. */
function fakeServer(opts: { refuse?: (body: Record<string, unknown>) => SendError | null; down?: () => boolean } = {}) {
  const stored = new Map<string, Record<string, unknown>>();
  const calls: { path: string; key: string; count: number }[] = [];
  const send: Send = async (path, body, key) => {
    const b = body as Record<string, unknown>;
    const readings = (b.readings as Record<string, unknown>[] | undefined) ?? [b];
    calls.push({ path, key, count: readings.length });
    if (opts.down?.()) throw new SendError(0, 'offline', 'No answer');
    const errors = readings.map((r) => (stored.has(String(r.clientKey)) ? null : (opts.refuse?.(r) ?? null)));
    if (!b.readings && errors[0]) throw errors[0];
    if (b.readings && errors.some(Boolean)) {
      const fields: Record<string, string> = {};
      errors.forEach((err, i) => {
        for (const [k, v] of Object.entries(err?.fields ?? {})) fields[`readings.${String(i)}.${k}`] = v;
      });
      throw new SendError(400, 'invalid_input', 'Check the readings.', fields);
    }
    let n = 0;
    for (const r of readings) {
      if (!stored.has(String(r.clientKey))) n += 1;
      stored.set(String(r.clientKey), r);
    }
    return b.readings ? { stored: n, duplicates: readings.length - n } : { ...b, id: `id-${String(b.clientKey)}` };
  };
  return { send, stored, calls };
}

describe('the outbox', () => {
  it('sends consecutive readings of one run as one batch, other entries alone, in the order they were made', () => {
    const a = entry();
    const b = entry();
    const care = entry({ kind: 'care-cycle', path: '/cartridges/c1/cycles', runId: undefined });
    const c = entry();
    const other = entry({ runId: 'r2', path: '/runs/r2/readings' });
    const refused = entry({ status: 'refused' });
    const groups = plan([other, c, refused, care, b, a]);
    expect(groups.map((g) => g.map((e) => e.id))).toEqual([[a.id, b.id], [care.id], [c.id], [other.id]]);
    const many = Array.from({ length: OUTBOX_BATCH_MAX + 5 }, () => entry());
    expect(plan(many).map((g) => g.length)).toEqual([OUTBOX_BATCH_MAX, 5]);
  });

  it('stores each entry once: offline it keeps everything, and when the connection returns it sends and empties', async () => {
    const storage = memoryStorage([entry(), entry(), entry()]);
    let offline = true;
    const server = fakeServer({ down: () => offline });
    const first = await flush(storage, server.send);
    expect(first.map((o) => o.result)).toEqual(['waiting', 'waiting', 'waiting']);
    expect(storage.map.size).toBe(3);
    expect([...storage.map.values()].every((e) => e.attempts === 1)).toBe(true);

    offline = false;
    const second = await flush(storage, server.send);
    expect(second.map((o) => o.result)).toEqual(['stored', 'stored', 'stored']);
    expect(storage.map.size).toBe(0);
    expect(server.stored.size).toBe(3);
    // The three went in one batch request.
    expect(server.calls.at(-1)).toMatchObject({ path: '/runs/r1/readings/batch', count: 3 });
  });

  it('a lost answer is sent again with the same key, and the server stores it once', async () => {
    const e = entry();
    const storage = memoryStorage([e]);
    const server = fakeServer();
    let drop = true;
    const lossy: Send = async (path, body, key) => {
      const answer = await server.send(path, body, key);
      if (drop) {
        drop = false;
        throw new SendError(0, 'offline', 'The answer was lost');
      }
      return answer;
    };
    expect((await flush(storage, lossy))[0].result).toBe('waiting');
    expect((await flush(storage, lossy))[0].result).toBe('stored');
    expect(server.stored.size).toBe(1);
    expect(server.calls.map((c) => c.key)).toEqual([e.id, e.id]);
    // One reading alone asks for its stage's figures.
    expect(server.calls[0].path).toBe('/runs/r1/readings?with=stage');
  });

  it('a refused batch is sent one by one: the good readings are stored, the bad one is kept with the reason', async () => {
    const good1 = entry();
    const bad = entry({ body: { clientKey: 'bad', stageIndex: 0, volumeL: 1, upstreamBar: 1, downstreamBar: 2 }, id: 'bad' });
    const good2 = entry();
    const storage = memoryStorage([good1, bad, good2]);
    const server = fakeServer({
      refuse: (r) => ((r.downstreamBar as number) > (r.upstreamBar as number) ? new SendError(400, 'invalid_input', 'Check the reading.', { downstreamBar: 'Downstream above upstream' }) : null),
    });
    const outcomes = await flush(storage, server.send);
    expect(outcomes.map((o) => [o.id, o.result])).toEqual([
      [good1.id, 'stored'],
      ['bad', 'refused'],
      [good2.id, 'stored'],
    ]);
    expect([...storage.map.keys()]).toEqual(['bad']);
    const kept = storage.map.get('bad')!;
    expect(kept.status).toBe('refused');
    expect(kept.refusal).toMatchObject({ status: 400, message: 'Check the reading.', fields: { downstreamBar: 'Downstream above upstream' } });
    // A refused entry is not sent again until the person fixes it.
    const calls = server.calls.length;
    expect(await flush(storage, server.send)).toEqual([]);
    expect(server.calls.length).toBe(calls);
  });

  it('stops at the first entry without an answer, so nothing overtakes it', async () => {
    const care = entry({ kind: 'care-cycle', path: '/cartridges/c1/cycles', runId: undefined });
    const later = entry();
    const storage = memoryStorage([care, later]);
    let calls = 0;
    const send: Send = async () => {
      calls += 1;
      throw new SendError(503, 'unavailable', 'Try later');
    };
    const outcomes = await flush(storage, send);
    expect(calls).toBe(1);
    expect(outcomes.map((o) => o.result)).toEqual(['waiting', 'waiting']);
    expect(storage.map.size).toBe(2);
  });

  it('signed out (401) keeps entries waiting; only the maker, in the winery they were made in, sends them', async () => {
    const e = entry();
    const storage = memoryStorage([e]);
    const send: Send = async () => {
      throw new SendError(401, 'unauthenticated', 'Sign in');
    };
    expect((await flush(storage, send))[0].result).toBe('waiting');
    expect(belongsTo(e, { userId: 'u1', wineryId: 'w1' })).toBe(true);
    expect(belongsTo(e, { userId: 'u2', wineryId: 'w1' })).toBe(false);
    expect(belongsTo(e, { userId: 'u1', wineryId: 'w2' })).toBe(false);
    expect(belongsTo(e, { userId: null, wineryId: null })).toBe(false);
    const server = fakeServer();
    expect(await flush(storage, server.send, { only: (x) => belongsTo(x, { userId: 'u2', wineryId: 'w1' }) })).toEqual([]);
    expect(server.calls).toEqual([]);
  });
});
