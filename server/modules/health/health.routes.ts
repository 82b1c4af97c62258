import { sql } from 'drizzle-orm';
import { Router } from 'express';
import type { Database } from '../../db/client';

export function healthRoutes({ db }: { db: Database }) {
  const router = Router();
  router.get('/', async (_req, res) => {
    const dbOk = await db.execute(sql`select 1`).then(() => true, () => false);
    res.status(dbOk ? 200 : 503).json({ ok: dbOk, db: dbOk });
  });
  return router;
}
