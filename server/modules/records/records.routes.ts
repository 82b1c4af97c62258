import { Router } from 'express';
import { recordLotsQuerySchema, recordPdfQuerySchema, verifyRecordInputSchema } from '../../../shared/schemas/records';
import { idParam } from '../../lib/params';
import { requireSignedIn } from '../../middleware/authenticate';
import { authorize, tenantOf } from '../../middleware/authorize';
import { withBody, withQuery } from '../../middleware/validate';
import type { ModuleDeps } from '../module-deps';
import { recordCsv } from './records.csv';
import { renderRecordPdf } from './records.pdf';
import { createRecordsService } from './records.service';

/** A file name made of safe characters only (the lot code may hold anything). */
const fileName = (code: string, ext: string) => `filtration-record-${code.replace(/[^A-Za-z0-9._-]+/g, '-').slice(0, 60) || 'lot'}.${ext}`;

/**
 * The bottling filtration record of each lot: the bottled-lots list (with the reverse trace from a
 * cartridge serial or batch), the record as JSON, PDF and CSV, and the fingerprint check. Every role
 * reads records ('records:read') and exports them ('records:export'), auditors included.
 */
export function recordsRoutes({ db }: ModuleDeps) {
  const router = Router();
  const service = createRecordsService(db);
  const read = [requireSignedIn, authorize(db, 'records:read')];
  const exportable = [requireSignedIn, authorize(db, 'records:export')];

  router.get('/records/lots', ...read, withQuery(recordLotsQuerySchema, async (_req, res, query) => {
    res.json(await service.list(tenantOf(res), query));
  }));
  router.get('/records/lots/:lotId', ...read, async (req, res) => {
    res.json(await service.record(tenantOf(res), idParam(req, 'lotId', 'Lot')));
  });
  router.get('/records/lots/:lotId/pdf', ...exportable, withQuery(recordPdfQuerySchema, async (req, res, query) => {
    const record = await service.record(tenantOf(res), idParam(req, 'lotId', 'Lot'));
    const pdf = await renderRecordPdf(record, query.paper);
    res.set('Content-Type', 'application/pdf');
    res.set('Content-Disposition', `attachment; filename="${fileName(record.lot.code, 'pdf')}"`);
    res.set('X-Record-Fingerprint', record.fingerprint);
    res.send(pdf);
  }));
  router.get('/records/lots/:lotId/csv', ...exportable, async (req, res) => {
    const record = await service.record(tenantOf(res), idParam(req, 'lotId', 'Lot'));
    res.set('Content-Type', 'text/csv; charset=utf-8');
    res.set('Content-Disposition', `attachment; filename="${fileName(record.lot.code, 'csv')}"`);
    res.set('X-Record-Fingerprint', record.fingerprint);
    res.send(recordCsv(record));
  });
  router.post('/records/verify', ...read, withBody(verifyRecordInputSchema, async (_req, res, body) => {
    res.json(await service.verify(tenantOf(res), body));
  }));

  return router;
}
