import { Router } from 'express';
import { createHosePresetInputSchema, updateHosePresetInputSchema } from '../../../shared/schemas/hose-presets';
import { idParam } from '../../lib/params';
import { requireSignedIn } from '../../middleware/authenticate';
import { authorize, tenantOf } from '../../middleware/authorize';
import { idempotent } from '../../middleware/idempotency';
import { withBody } from '../../middleware/validate';
import type { ModuleDeps } from '../module-deps';
import { createHosePresetsService } from './hose-presets.service';

/**
 * A winery's hose presets. Everyone who reads plans reads them ('plans:read'); whoever drafts
 * plans creates, changes and deletes them ('plans:draft'), as for a train's hoses.
 */
export function hosePresetsRoutes({ db }: ModuleDeps) {
  const router = Router();
  const service = createHosePresetsService(db);
  const read = [requireSignedIn, authorize(db, 'plans:read')];
  const edit = [requireSignedIn, authorize(db, 'plans:draft')];

  router.get('/hose-presets', ...read, async (_req, res) => {
    res.json({ items: await service.list(tenantOf(res)) });
  });
  router.post('/hose-presets', ...edit, idempotent(db), withBody(createHosePresetInputSchema, async (_req, res, body) => {
    res.status(201).json(await service.create(tenantOf(res), body));
  }));
  router.get('/hose-presets/:id', ...read, async (req, res) => {
    res.json(await service.get(tenantOf(res), idParam(req, 'id', 'Hose preset')));
  });
  router.patch('/hose-presets/:id', ...edit, withBody(updateHosePresetInputSchema, async (req, res, body) => {
    res.json(await service.update(tenantOf(res), idParam(req, 'id', 'Hose preset'), body));
  }));
  router.delete('/hose-presets/:id', ...edit, async (req, res) => {
    await service.remove(tenantOf(res), idParam(req, 'id', 'Hose preset'));
    res.status(204).end();
  });
  return router;
}
