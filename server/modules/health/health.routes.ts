import { Router } from 'express';
import type { Database } from '../../db/client';
import { createHealthRepository } from './health.repository';

export function healthRoutes({ db }: { db: Database }) {
  const router = Router();
  const health = createHealthRepository(db);
  router.get('/', async (_req, res) => {
    const dbOk = await health.ping();
    res.status(dbOk ? 200 : 503).json({ ok: dbOk, db: dbOk });
  });
  return router;
}
