import { Router } from 'express';
import { updateWinerySettingsInputSchema } from '../../../shared/schemas/winery-settings';
import { requireSignedIn } from '../../middleware/authenticate';
import { authorize, tenantOf } from '../../middleware/authorize';
import { withBody } from '../../middleware/validate';
import type { ModuleDeps } from '../module-deps';
import { createWinerySettingsService } from './winery-settings.service';

/** The active winery's own settings: name and readiness thresholds (owner edits, all read). */
export function winerySettingsRoutes({ db }: ModuleDeps) {
  const router = Router();
  const service = createWinerySettingsService(db);
  router.get('/settings/winery', requireSignedIn, authorize(db, 'settings:read'), async (_req, res) => {
    res.json(await service.get(tenantOf(res).wineryId));
  });
  // PATCH is the verb; PUT stays as an alias for one release (deprecated). Both take any subset.
  for (const method of ['patch', 'put'] as const) {
    router[method]('/settings/winery', requireSignedIn, authorize(db, 'settings:edit'), withBody(updateWinerySettingsInputSchema, async (_req, res, body) => {
      res.json(await service.update(tenantOf(res).wineryId, body, tenantOf(res).userId));
    }));
  }
  return router;
}
