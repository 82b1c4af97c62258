import { Router } from 'express';
import { auditFilterSchema, auditListQuerySchema } from '../../../shared/schemas/audit';
import { requireSignedIn } from '../../middleware/authenticate';
import { authorize, tenantOf } from '../../middleware/authorize';
import { withQuery } from '../../middleware/validate';
import type { ModuleDeps } from '../module-deps';
import { createAuditService } from './audit.service';

/**
 * The change log, read only: no route updates or deletes an event. Owners and auditors read
 * every event of their winery; the other roles the events of the kinds of record they may read.
 */
export function auditRoutes({ db }: ModuleDeps) {
  const router = Router();
  const service = createAuditService(db);
  const read = [requireSignedIn, authorize(db, 'audit:read')];

  router.get('/audit', ...read, withQuery(auditListQuerySchema, async (_req, res, query) => {
    res.json(await service.list(tenantOf(res), query));
  }));
  router.get('/audit/people', ...read, async (_req, res) => {
    res.json(await service.people(tenantOf(res)));
  });
  router.get('/audit/csv', ...read, withQuery(auditFilterSchema, async (_req, res, query) => {
    const stamp = new Date().toISOString().slice(0, 10);
    res.set({ 'Content-Type': 'text/csv; charset=utf-8', 'Content-Disposition': `attachment; filename="change-log-${stamp}.csv"` });
    try {
      await service.writeCsv(tenantOf(res), query, res);
    } catch (error) {
      if (!res.headersSent) throw error;
      res.destroy(error as Error);
    }
  }));

  return router;
}
