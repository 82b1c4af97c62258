// @vitest-environment node
import { randomUUID } from 'node:crypto';
import { sql } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { startedRunOn } from '../factories/plans';
import { setupApiApp } from '../support/api-app';
import { signUp } from '../support/test-app';

const app = setupApiApp({ wineryName: 'Batch Readings Winery', members: true, world: 'filled' });

const startedRun = () => startedRunOn(app.owner, app.world, app.members.technician);

const reading = (i: number, over: Record<string, unknown> = {}) => ({
  clientKey: randomUUID(),
  stageIndex: i % 2,
  volumeL: 10 * i,
  upstreamBar: 2 + i / 10_000,
  downstreamBar: 2,
  ...over,
});

async function storedCount(runId: string) {
  const res = await app.db.execute(sql`select count(*)::int as n, count(distinct client_key)::int as keys from run_readings where run_id = ${runId}::uuid`);
  return res.rows[0] as { n: number; keys: number };
}

describe('readings in batches', () => {
  it('stores 1,000 readings in one request, and a resend stores nothing twice', async () => {
    const run = await startedRun();
    const readings = Array.from({ length: 1000 }, (_x, i) => reading(i));
    const first = await app.members.technician.post(`/api/runs/${run.id}/readings/batch`, { readings });
    expect(first.status).toBe(200);
    expect(first.body).toEqual({ stored: 1000, duplicates: 0 });
    const again = await app.members.technician.post(`/api/runs/${run.id}/readings/batch`, { readings });
    expect(again.body).toEqual({ stored: 0, duplicates: 1000 });
    // A batch that repeats part of an earlier one stores only the new readings.
    const more = [...readings.slice(990), reading(1000), reading(1001)];
    expect((await app.members.technician.post(`/api/runs/${run.id}/readings/batch`, { readings: more })).body).toEqual({ stored: 2, duplicates: 10 });
    expect(await storedCount(run.id)).toEqual({ n: 1002, keys: 1002 });
    const detail = await app.owner.get(`/api/runs/${run.id}`);
    expect(detail.body.readingCount).toBe(1002);
    expect(detail.body.stages[0].readings[0].byName).toEqual(expect.any(String));

    const tooMany = await app.members.technician.post(`/api/runs/${run.id}/readings/batch`, { readings: [...readings, reading(2000)] });
    expect(tooMany.status).toBe(400);
    expect(tooMany.body.error.fields.readings).toMatch(/1,000/);
  });

  it('stores once per clientKey when the same batch is sent several times at once', async () => {
    const run = await startedRun();
    const readings = Array.from({ length: 50 }, (_x, i) => reading(i));
    const answers = await Promise.all(Array.from({ length: 6 }, () => app.members.technician.post(`/api/runs/${run.id}/readings/batch`, { readings })));
    expect(answers.map((a) => a.status)).toEqual(Array(6).fill(200));
    expect(answers.reduce((sum, a) => sum + (a.body.stored as number), 0)).toBe(50);
    expect(await storedCount(run.id)).toEqual({ n: 50, keys: 50 });

    // Single readings sent concurrently with the same key: one row.
    const one = reading(60, { stageIndex: 0, volumeL: 5000 });
    const singles = await Promise.all(Array.from({ length: 6 }, () => app.members.technician.post(`/api/runs/${run.id}/readings`, one)));
    expect(new Set(singles.map((s) => s.body.id)).size).toBe(1);
    expect(await storedCount(run.id)).toEqual({ n: 51, keys: 51 });
  });

  it('checks every reading before storing any, and names the bad ones', async () => {
    const run = await startedRun();
    const readings = [
      reading(0, { stageIndex: 0, volumeL: 100 }),
      reading(1, { stageIndex: 0, volumeL: 50 }),
      reading(2, { stageIndex: 7 }),
      reading(3, { stageIndex: 1, upstreamBar: 1, downstreamBar: 1.5 }),
    ];
    const res = await app.members.technician.post(`/api/runs/${run.id}/readings/batch`, { readings });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/3 are not right, so none was stored/);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['readings.1.volumeL', 'readings.2.stageIndex', 'readings.3.downstreamBar']);
    expect(res.body.error.fields['readings.1.volumeL']).toMatch(/100 L/);
    const schemaBad = await app.members.technician.post(`/api/runs/${run.id}/readings/batch`, { readings: [reading(0), { ...reading(1), upstreamBar: 'x' }] });
    expect(schemaBad.status).toBe(400);
    expect(schemaBad.body.error.fields).toHaveProperty('readings.1.upstreamBar');
    expect((await storedCount(run.id)).n).toBe(0);
  });

  it('a closed run refuses new readings with the reason, but answers a resend of stored ones', async () => {
    const run = await startedRun();
    const stored = [reading(0), reading(1)];
    expect((await app.members.technician.post(`/api/runs/${run.id}/readings/batch`, { readings: stored })).body).toEqual({ stored: 2, duplicates: 0 });
    expect((await app.members.technician.post(`/api/runs/${run.id}/close`)).status).toBe(200);
    const late = await app.members.technician.post(`/api/runs/${run.id}/readings/batch`, { readings: [...stored, reading(2)] });
    expect(late.status).toBe(409);
    expect(late.body.error.code).toBe('run_closed');
    expect(late.body.error.message).toMatch(/closed/);
    expect((await app.members.technician.post(`/api/runs/${run.id}/readings/batch`, { readings: stored })).body).toEqual({ stored: 0, duplicates: 2 });
    expect((await storedCount(run.id)).n).toBe(2);
  });

  it('roles: loggers may send batches, the auditor may not; another winery gets 404', async () => {
    const run = await startedRun();
    for (const role of ['cellar-master', 'winemaker', 'technician'] as const) {
      expect((await app.members[role].post(`/api/runs/${run.id}/readings/batch`, { readings: [reading(0, { volumeL: 0 })] })).status).toBe(200);
    }
    expect((await app.owner.post(`/api/runs/${run.id}/readings/batch`, { readings: [reading(0, { volumeL: 0 })] })).status).toBe(200);
    expect((await app.members.auditor.post(`/api/runs/${run.id}/readings/batch`, { readings: [reading(0)] })).status).toBe(403);
    const other = (await signUp(app.baseUrl, { wineryName: 'Other Batch Winery' })).client;
    expect((await other.post(`/api/runs/${run.id}/readings/batch`, { readings: [reading(0)] })).status).toBe(404);
    expect((await app.owner.post(`/api/runs/${randomUUID()}/readings/batch`, { readings: [reading(0)] })).status).toBe(404);
    expect((await storedCount(run.id)).n).toBe(4);
  });

  it('a single reading can answer with its stage’s new figures instead of the whole run', async () => {
    const run = await startedRun();
    for (const [i, v] of [500, 1000, 1500].entries()) {
      const res = await app.members.technician.post(`/api/runs/${run.id}/readings?with=stage`, reading(i, { stageIndex: 0, volumeL: v, upstreamBar: 2.2 + i * 0.05, flowLh: 2400 }));
      expect(res.status).toBe(201);
      expect(res.body.stage.index).toBe(0);
      expect(res.body.stage.readings).toHaveLength(i + 1);
      expect(res.body.run).toEqual({ currentVolumeL: v, readingCount: i + 1, volumeToBottleL: 6000 - v });
    }
    const full = await app.owner.get(`/api/runs/${run.id}`);
    const last = await app.members.technician.post(`/api/runs/${run.id}/readings?with=stage`, { ...full.body.stages[0].readings[2], clientKey: full.body.stages[0].readings[2].clientKey, id: undefined, dpBar: undefined, byName: undefined, at: undefined });
    expect(last.body.stage).toEqual(full.body.stages[0]);
  });
});
