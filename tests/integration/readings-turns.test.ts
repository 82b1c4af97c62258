// @vitest-environment node
// Readings of one run wait their turn in the process, not on a database connection: while the
// run's row is held elsewhere (a logger import, a close), a crowd of readings for it must not
// take the pool, so the health check and other pages still answer.
import { randomUUID } from 'node:crypto';
import pg from 'pg';
import { describe, expect, it } from 'vitest';
import { databaseUrl } from '../../scripts/lib/postgres';
import { startedRunOn } from '../factories/plans';
import { setupApiApp } from '../support/api-app';

const app = setupApiApp({ wineryName: 'Reading Turns Winery', members: true, world: 'filled' });

describe('readings of one run take turns', () => {
  it('queued readings leave the pool to other requests, and are all stored once the run is free', async () => {
    const run = await startedRunOn(app.owner, app.world, app.members.technician);
    const holder = new pg.Client({ connectionString: databaseUrl('porewise_test') });
    await holder.connect();
    try {
      await holder.query('begin');
      await holder.query('select 1 from runs where id = $1 for update', [run.id]);
      // More readings than the test app's pool has connections (5).
      const posts = Array.from({ length: 12 }, (_x, i) =>
        app.members.technician.post(`/api/runs/${run.id}/readings`, { clientKey: randomUUID(), stageIndex: i % 2, volumeL: 100 + i, upstreamBar: 1.2, downstreamBar: 1 }),
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
      expect(answers.map((a) => a.status)).toEqual(Array(12).fill(201));
      const detail = await app.owner.get(`/api/runs/${run.id}`);
      expect(detail.body.readingCount).toBe(12);
    } finally {
      await holder.query('rollback').catch(() => {});
      await holder.end();
    }
  });
});
