import { Router } from 'express';
import { setActiveWineryInputSchema, updateMeInputSchema } from '../../../shared/schemas/auth';
import { authOf, requireSignedIn } from '../../middleware/authenticate';
import { validateBody } from '../../middleware/validate';
import type { AccountService } from './account.service';

export function accountRoutes({ service }: { service: AccountService }) {
  const router = Router();
  router.use(requireSignedIn);
  router.get('/', async (_req, res) => {
    res.json(await service.me(authOf(res).user));
  });
  router.put('/', validateBody(updateMeInputSchema), async (_req, res) => {
    res.json(await service.update(authOf(res).user, res.locals.body));
  });
  router.put('/active-winery', validateBody(setActiveWineryInputSchema), async (_req, res) => {
    res.json(await service.setActiveWinery(authOf(res).user, res.locals.body.wineryId));
  });
  return router;
}
