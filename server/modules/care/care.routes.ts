import { Router } from 'express';
import { logCycleInputSchema, recordIntegrityInputSchema } from '../../../shared/schemas/care';
import { idParam } from '../../lib/params';
import { requireSignedIn } from '../../middleware/authenticate';
import { authorize, tenantOf } from '../../middleware/authorize';
import { idempotent } from '../../middleware/idempotency';
import { withBody } from '../../middleware/validate';
import type { ModuleDeps } from '../module-deps';
import { createCareService } from './care.service';

/**
 * Care of cartridges: regeneration, sanitation and sterilisation cycles and integrity tests,
 * kept in each cartridge's history. Logging needs 'care:log' (owner, cellar master,
 * winemaker, technician); reading needs 'care:read'.
 */
export function careRoutes({ db }: ModuleDeps) {
  const router = Router();
  const service = createCareService(db);
  const read = [requireSignedIn, authorize(db, 'care:read')];
  const log = [requireSignedIn, authorize(db, 'care:log')];

  router.get('/care/recent', ...read, async (_req, res) => {
    res.json(await service.recent(tenantOf(res)));
  });

  router.get('/care/cartridges/:id', ...read, async (req, res) => {
    res.json(await service.target(tenantOf(res), idParam(req, 'id', 'Cartridge')));
  });

  router.post('/cartridges/:id/cycles', ...log, idempotent(db), withBody(logCycleInputSchema, async (req, res, body) => {
    res.status(201).json(await service.logCycle(tenantOf(res), idParam(req, 'id', 'Cartridge'), body));
  }));

  router.post('/cartridges/:id/integrity-tests', ...log, idempotent(db), withBody(recordIntegrityInputSchema, async (req, res, body) => {
    res.status(201).json(await service.recordIntegrity(tenantOf(res), idParam(req, 'id', 'Cartridge'), body));
  }));

  return router;
}
