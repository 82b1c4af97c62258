// @vitest-environment node
// A run stores its reading count and litres through the train (runs.reading_count,
// runs.current_volume_l), kept in the same statement or transaction as every reading write;
// the runs list and the run detail read them. Each check compares the stored figures with
// a count over the record itself.
import { randomUUID } from 'node:crypto';
import { sql } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { startedRunOn } from '../factories/plans';
import { setupApiApp } from '../support/api-app';

const app = setupApiApp({ wineryName: 'Run Counters Winery', world: 'filled' });

const startedRun = () => startedRunOn(app.owner, app.world);

const reading = (volumeL: number, over: Record<string, unknown> = {}) => ({
  clientKey: randomUUID(),
  stageIndex: 0,
  volumeL,
  upstreamBar: 2.2 + volumeL / 100_000,
  downstreamBar: 2,
  ...over,
});

/** The stored columns on the run row. */
async function stored(runId: string) {
  const res = await app.db.execute(sql`select reading_count as n, current_volume_l as v from runs where id = ${runId}::uuid`);
  const row = res.rows[0] as { n: number; v: number };
  return { readingCount: Number(row.n), currentVolumeL: Number(row.v) };
}

/** What the API shows in the detail and in the list. */
async function shown(runId: string) {
  const detail = (await app.owner.get(`/api/runs/${runId}`)).body as { readingCount: number; currentVolumeL: number };
  const listed = ((await app.owner.get('/api/runs')).body.items as { id: string; readingCount: number; currentVolumeL: number }[]).find((r) => r.id === runId)!;
  expect({ readingCount: listed.readingCount, currentVolumeL: listed.currentVolumeL }).toEqual({ readingCount: detail.readingCount, currentVolumeL: detail.currentVolumeL });
  return { readingCount: detail.readingCount, currentVolumeL: detail.currentVolumeL };
}

describe('stored run counters', () => {
  it('a reading counts once: the insert bumps the run, a resent key does not', async () => {
    const run = await startedRun();
    expect(await stored(run.id)).toEqual({ readingCount: 0, currentVolumeL: 0 });
    const first = reading(500);
    expect((await app.owner.post(`/api/runs/${run.id}/readings`, first)).status).toBe(201);
    expect(await stored(run.id)).toEqual({ readingCount: 1, currentVolumeL: 500 });
    // the phone resends after a dropped connection: the same reading, stored once, counted once
    expect((await app.owner.post(`/api/runs/${run.id}/readings`, first)).status).toBe(201);
    expect(await stored(run.id)).toEqual({ readingCount: 1, currentVolumeL: 500 });
    // a later reading on the other stage at fewer litres leaves the litres through the train alone
    expect((await app.owner.post(`/api/runs/${run.id}/readings`, reading(300, { stageIndex: 1 }))).status).toBe(201);
    expect(await stored(run.id)).toEqual({ readingCount: 2, currentVolumeL: 500 });
    // a refused reading (litres going down on the stage) counts nothing
    expect((await app.owner.post(`/api/runs/${run.id}/readings`, reading(100))).status).toBe(400);
    expect(await shown(run.id)).toEqual({ readingCount: 2, currentVolumeL: 500 });
  });

  it('a batch bumps the counters by what it stored; a resent batch by nothing', async () => {
    const run = await startedRun();
    const readings = Array.from({ length: 40 }, (_x, i) => reading(100 * (i + 1), { stageIndex: i % 2 }));
    expect((await app.owner.post(`/api/runs/${run.id}/readings/batch`, { readings })).body).toEqual({ stored: 40, duplicates: 0 });
    expect(await stored(run.id)).toEqual({ readingCount: 40, currentVolumeL: 4000 });
    expect((await app.owner.post(`/api/runs/${run.id}/readings/batch`, { readings })).body).toEqual({ stored: 0, duplicates: 40 });
    const more = [...readings.slice(35), reading(4100, { stageIndex: 0 }), reading(4200, { stageIndex: 1 })];
    expect((await app.owner.post(`/api/runs/${run.id}/readings/batch`, { readings: more })).body).toEqual({ stored: 2, duplicates: 5 });
    expect(await shown(run.id)).toEqual({ readingCount: 42, currentVolumeL: 4200 });
    const count = await app.db.execute(sql`select count(*)::int as n, max(volume_l) as v from run_readings where run_id = ${run.id}::uuid`);
    expect(await stored(run.id)).toEqual({ readingCount: Number((count.rows[0] as { n: number }).n), currentVolumeL: Number((count.rows[0] as { v: number }).v) });
  });

  it('concurrent readings on one run are all counted', async () => {
    const run = await startedRun();
    const sent = await Promise.all(Array.from({ length: 20 }, (_x, i) => app.owner.post(`/api/runs/${run.id}/readings`, reading(0, { stageIndex: i % 2, clientKey: `parallel-${String(i)}` }))));
    expect(sent.every((r) => r.status === 201)).toBe(true);
    expect(await stored(run.id)).toEqual({ readingCount: 20, currentVolumeL: 0 });
  });

  it('a correction and a void count the record again: a voided reading leaves the count, a corrected volume replaces the typed one', async () => {
    const run = await startedRun();
    const ids: string[] = [];
    for (const v of [500, 1000, 1500]) ids.push((await app.owner.post(`/api/runs/${run.id}/readings`, reading(v))).body.id as string);
    const typo = await app.owner.post(`/api/runs/${run.id}/readings`, reading(20_000));
    expect(await stored(run.id)).toEqual({ readingCount: 4, currentVolumeL: 20_000 });

    // 20,000 was typed for 2,000: corrected, the run is at 2,000 L
    const corrected = await app.owner.post(`/api/runs/${run.id}/readings/${typo.body.id as string}/correct`, {
      volumeL: 2000,
      upstreamBar: 2.3,
      downstreamBar: 2,
      reason: 'Typed 20000 for 2000.',
    });
    expect(corrected.status).toBe(201);
    expect(corrected.body).toMatchObject({ readingCount: 4, currentVolumeL: 2000 });
    expect(await stored(run.id)).toEqual({ readingCount: 4, currentVolumeL: 2000 });

    // the highest reading voided: one fewer reading, and the litres fall back to the next highest
    const voided = await app.owner.post(`/api/runs/${run.id}/readings/${typo.body.id as string}/void`, { reason: 'Gauge was being swapped.' });
    expect(voided.status).toBe(201);
    expect(voided.body).toMatchObject({ readingCount: 3, currentVolumeL: 1500 });
    expect(await shown(run.id)).toEqual({ readingCount: 3, currentVolumeL: 1500 });
    // the voided reading stays in the record
    expect((voided.body.stages[0].readings as { id: string; voided: boolean }[]).find((r) => r.id === typo.body.id)?.voided).toBe(true);

    // a correction after the void brings it back into the count
    await app.owner.post(`/api/runs/${run.id}/readings/${typo.body.id as string}/correct`, { volumeL: 2100, upstreamBar: 2.3, downstreamBar: 2, reason: 'The reading was fine after all.' });
    expect(await stored(run.id)).toEqual({ readingCount: 4, currentVolumeL: 2100 });
    await app.owner.post(`/api/runs/${run.id}/readings/${ids[0]}/void`, { reason: 'Logged before the train was vented.' });
    expect(await shown(run.id)).toEqual({ readingCount: 3, currentVolumeL: 2100 });
  });

  it('closing keeps the counters, credits the litres they say, and a closed run takes no reading into them', async () => {
    const run = await startedRun();
    for (const v of [1000, 2500]) expect((await app.owner.post(`/api/runs/${run.id}/readings`, reading(v))).status).toBe(201);
    const closed = await app.owner.post(`/api/runs/${run.id}/close`, { notes: 'Bottled.' });
    expect(closed.status).toBe(200);
    expect(closed.body).toMatchObject({ status: 'closed', readingCount: 2, currentVolumeL: 2500 });
    expect((await app.owner.post(`/api/runs/${run.id}/readings`, reading(3000))).status).toBe(409);
    expect((await app.owner.post(`/api/runs/${run.id}/readings/batch`, { readings: [reading(3000)] })).status).toBe(409);
    expect(await shown(run.id)).toEqual({ readingCount: 2, currentVolumeL: 2500 });
    const credited = await app.db.execute(sql`select max(litres_carried) as v from run_stage_cartridges where run_id = ${run.id}::uuid and stage_index = 0`);
    expect(Number((credited.rows[0] as { v: number }).v)).toBe(2500);
  });
});
