import { Router } from 'express';
import { setActiveWineryInputSchema, updateMeInputSchema } from '../../../shared/schemas/auth';
import { authOf, requireSignedIn } from '../../middleware/authenticate';
import { withBody } from '../../middleware/validate';
import type { AccountService } from './account.service';

export function accountRoutes({ service }: { service: AccountService }) {
  const router = Router();
  router.use(requireSignedIn);
  router.get('/', async (_req, res) => {
    res.json(await service.me(authOf(res).user));
  });
  // PATCH is the verb; PUT stays as an alias for one release (deprecated). Both take any subset.
  for (const method of ['patch', 'put'] as const) {
    router[method]('/', withBody(updateMeInputSchema, async (_req, res, body) => {
      res.json(await service.update(authOf(res).user, body));
    }));
    router[method]('/active-winery', withBody(setActiveWineryInputSchema, async (_req, res, body) => {
      res.json(await service.setActiveWinery(authOf(res).user, body.wineryId));
    }));
  }
  return router;
}
