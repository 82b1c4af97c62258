// @vitest-environment node
// Readings of one run wait their turn in the process, not on a database connection: while the
// run's row is held elsewhere (a logger import, a close), a crowd of readings for it must not
// take the pool, so the health check and other pages still answer.
import { randomUUID } from 'node:crypto';
import { sql } from 'drizzle-orm';
import pg from 'pg';
import { describe, expect, it } from 'vitest';
import { databaseUrl } from '../../scripts/lib/postgres';
import { startedRunOn } from '../factories/plans';
import { setupApiApp } from '../support/api-app';
import { createRunsRepository, type NewReading } from '../../server/modules/runs/runs.repository';
import { READINGS_PER_TURN } from '../../server/modules/runs/runs.service';

const app = setupApiApp({ wineryName: 'Reading Turns Winery', otherWineryName: 'Reading Turns Neighbour', members: true, world: 'filled' });

describe('readings of one run take turns', () => {
  it('queued readings leave the pool to other requests, and are all stored once the run is free', async () => {
    const run = await startedRunOn(app.owner, app.world, app.members.technician);
    const holder = new pg.Client({ connectionString: databaseUrl('porewise_test') });
    await holder.connect();
    try {
      await holder.query('begin');
      await holder.query('select 1 from runs where id = $1 for update', [run.id]);
      // More readings than the test app's pool has connections (5), and than two turns take (so
      // the later turns keep their distance). They may reach the server in any order, so each
      // stage's readings carry the same litres (never "going down").
      const count = READINGS_PER_TURN * 2 + 8;
      const posts = Array.from({ length: count }, (_x, i) =>
        app.members.technician.post(`/api/runs/${run.id}/readings`, { clientKey: randomUUID(), stageIndex: i % 2, volumeL: 100, upstreamBar: 1.2, downstreamBar: 1 }),
      );
      // Wait until the first reading is blocked on the run's row.
      for (let i = 0; i < 200; i++) {
        const { rows } = await holder.query(`select count(*)::int as n from pg_locks where not granted and pid <> pg_backend_pid()`);
        if ((rows[0] as { n: number }).n > 0) break;
        await new Promise((r) => setTimeout(r, 25));
      }
      const health = await app.owner.get('/api/health');
      expect(health.status).toBe(200);
      expect(health.body).toMatchObject({ db: true });
      expect((await app.owner.get('/api/cartridges')).status).toBe(200);
      await holder.query('commit');
      const answers = await Promise.all(posts);
      // Stored together or not, each answer is that request's own reading.
      const sent = posts.length;
      expect(new Set(answers.map((a) => a.body.id)).size).toBe(sent);
      expect(answers.map((a) => [a.status, a.status === 201 ? null : JSON.stringify(a.body)])).toEqual(Array(count).fill([201, null]));
      const detail = await app.owner.get(`/api/runs/${run.id}`);
      expect(detail.body.readingCount).toBe(count);
    } finally {
      await holder.query('rollback').catch(() => {});
      await holder.end();
    }
  });

  it('readings stored in one statement come out as if stored one after the other, in order', async () => {
    const run = await startedRunOn(app.owner, app.world, app.members.technician);
    const repo = createRunsRepository(app.db);
    const userId = ((await app.members.technician.get('/api/me')).body as { user: { id: string } }).user.id;
    const r = (clientKey: string, stageIndex: number, volumeL: number): { reading: NewReading; userId: string } => ({
      userId,
      reading: { clientKey, stageIndex, volumeL, upstreamBar: 1.5, downstreamBar: 1, flowLh: null, tempC: null, at: null },
    });
    const stored = await repo.insertReadingsIfOpen(app.wineryId, run.id, [
      r('k1', 0, 100),
      r('k2', 0, 90), // below k1, which came first: refused
      r('k3', 1, 50), // another stage keeps its own litres
      r('k1', 0, 100), // the same key again: stored once
      r('k4', 9, 200), // no such stage
      r('k5', 0, 120),
      r('k6', 0, 110), // below k5
    ]);
    expect(stored.map((x) => x.clientKey).sort()).toEqual(['k1', 'k3', 'k5']);
    // Stamped one after the other too (microseconds apart): in time order, they are in the order sent.
    const inTime = await app.db.execute(sql`select client_key from run_readings where run_id = ${run.id}::uuid order by at`);
    expect(inTime.rows.map((x) => (x as { client_key: string }).client_key)).toEqual(['k1', 'k3', 'k5']);
    expect(stored.every((x) => x.byName && x.createdBy === userId)).toBe(true);
    const again = await repo.insertReadingsIfOpen(app.wineryId, run.id, [r('k7', 0, 119), r('k5', 0, 120), r('k8', 0, 120)]);
    expect(again.map((x) => x.clientKey)).toEqual(['k8']);
    const detail = await app.owner.get(`/api/runs/${run.id}`);
    expect(detail.body.readingCount).toBe(4);
    expect(detail.body.currentVolumeL).toBe(120);
    // Another winery's id for the run stores nothing.
    expect(await repo.insertReadingsIfOpen(app.otherWineryId, run.id, [r('k9', 0, 500)])).toEqual([]);
  });
});
