import { Router } from 'express';
import {
  labResultInputSchema,
  labResultPatchSchema,
  lotInputSchema,
  lotPatchSchema,
  lotsListQuerySchema,
  tankInputSchema,
  tankPatchSchema,
  tanksListQuerySchema,
} from '../../../shared/schemas/cellar';
import { idParam } from '../../lib/params';
import { requireSignedIn } from '../../middleware/authenticate';
import { authorize, tenantOf } from '../../middleware/authorize';
import { idempotent } from '../../middleware/idempotency';
import { withBody, withQuery } from '../../middleware/validate';
import type { ModuleDeps } from '../module-deps';
import { createCellarService } from './cellar.service';

/** Tanks, lots and lab results: owner, cellar master and winemaker edit; everyone reads. */
export function cellarRoutes({ db }: ModuleDeps) {
  const router = Router();
  const service = createCellarService(db);
  const read = [requireSignedIn, authorize(db, 'cellar:read')];
  const edit = [requireSignedIn, authorize(db, 'cellar:edit')];
  const editLab = [requireSignedIn, authorize(db, 'lab-results:edit')];
  // Deleting records is the owner's (roles table); the others correct records by editing them.
  const remove = [requireSignedIn, authorize(db, 'records:delete')];
  const tankId = (req: Parameters<typeof idParam>[0]) => idParam(req, 'id', 'Tank');
  const lotId = (req: Parameters<typeof idParam>[0]) => idParam(req, 'id', 'Lot');
  const resultId = (req: Parameters<typeof idParam>[0]) => idParam(req, 'resultId', 'Lab result');

  // Tanks
  router.get('/tanks', ...read, withQuery(tanksListQuerySchema, async (_req, res, query) => {
    res.json(await service.listTanks(tenantOf(res), query));
  }));
  router.post('/tanks', ...edit, idempotent(db), withBody(tankInputSchema, async (_req, res, body) => {
    res.status(201).json(await service.createTank(tenantOf(res), body));
  }));
  router.get('/tanks/:id', ...read, async (req, res) => {
    res.json(await service.getTank(tenantOf(res), tankId(req)));
  });
  router.patch('/tanks/:id', ...edit, withBody(tankPatchSchema, async (req, res, body) => {
    res.json(await service.patchTank(tenantOf(res), tankId(req), body));
  }));
  // PUT with the whole tank: kept for one release beside PATCH (deprecated).
  router.put('/tanks/:id', ...edit, withBody(tankInputSchema, async (req, res, body) => {
    res.json(await service.updateTank(tenantOf(res), tankId(req), body));
  }));
  router.delete('/tanks/:id', ...remove, async (req, res) => {
    await service.deleteTank(tenantOf(res), tankId(req));
    res.status(204).end();
  });

  // Lots
  router.get('/lots', ...read, withQuery(lotsListQuerySchema, async (_req, res, query) => {
    res.json(await service.listLots(tenantOf(res), query));
  }));
  router.post('/lots', ...edit, idempotent(db), withBody(lotInputSchema, async (_req, res, body) => {
    res.status(201).json(await service.createLot(tenantOf(res), body));
  }));
  router.get('/lots/:id', ...read, async (req, res) => {
    res.json(await service.getLot(tenantOf(res), lotId(req)));
  });
  router.patch('/lots/:id', ...edit, withBody(lotPatchSchema, async (req, res, body) => {
    res.json(await service.patchLot(tenantOf(res), lotId(req), body));
  }));
  // PUT with the whole lot: kept for one release beside PATCH (deprecated).
  router.put('/lots/:id', ...edit, withBody(lotInputSchema, async (req, res, body) => {
    res.json(await service.updateLot(tenantOf(res), lotId(req), body));
  }));
  router.delete('/lots/:id', ...remove, async (req, res) => {
    await service.deleteLot(tenantOf(res), lotId(req));
    res.status(204).end();
  });

  // Lab results of a lot
  router.get('/lots/:id/lab-results', ...read, async (req, res) => {
    res.json(await service.listLabResults(tenantOf(res), lotId(req)));
  });
  router.post('/lots/:id/lab-results', ...editLab, idempotent(db), withBody(labResultInputSchema, async (req, res, body) => {
    res.status(201).json(await service.createLabResult(tenantOf(res), lotId(req), body));
  }));
  router.get('/lots/:id/lab-results/:resultId', ...read, async (req, res) => {
    res.json(await service.getLabResult(tenantOf(res), lotId(req), resultId(req)));
  });
  router.patch('/lots/:id/lab-results/:resultId', ...editLab, withBody(labResultPatchSchema, async (req, res, body) => {
    res.json(await service.patchLabResult(tenantOf(res), lotId(req), resultId(req), body));
  }));
  // PUT with the whole lab result: kept for one release beside PATCH (deprecated).
  router.put('/lots/:id/lab-results/:resultId', ...editLab, withBody(labResultInputSchema, async (req, res, body) => {
    res.json(await service.updateLabResult(tenantOf(res), lotId(req), resultId(req), body));
  }));
  router.delete('/lots/:id/lab-results/:resultId', ...remove, async (req, res) => {
    await service.deleteLabResult(tenantOf(res), lotId(req), resultId(req));
    res.status(204).end();
  });

  return router;
}
