import { Router } from 'express';
import type { Database } from '../../db/client';
import { createHealthRepository } from './health.repository';

/**
 * `GET /api/health`: liveness and the database ({ ok, db }; 503 when the database does not
 * answer). `GET /api/health/ready`: readiness for a load balancer: 503 while the process is
 * shutting down (draining) or the database does not answer, else 200.
 */
export function healthRoutes({ db, lifecycle }: { db: Database; lifecycle?: { draining: boolean } }) {
  const router = Router();
  const health = createHealthRepository(db);
  router.get('/', async (_req, res) => {
    const ok = await health.ping();
    res.status(ok ? 200 : 503).json({ ok, db: ok });
  });
  router.get('/ready', async (_req, res) => {
    const draining = lifecycle?.draining ?? false;
    // while draining the database is not asked: the answer is no whatever it says
    const dbOk = draining ? null : await health.ping();
    const ready = !draining && dbOk === true;
    res.status(ready ? 200 : 503).json({ ready, draining, db: dbOk });
  });
  return router;
}
