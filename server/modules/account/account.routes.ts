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
  router.put('/', withBody(updateMeInputSchema, async (_req, res, body) => {
    res.json(await service.update(authOf(res).user, body));
  }));
  router.put('/active-winery', withBody(setActiveWineryInputSchema, async (_req, res, body) => {
    res.json(await service.setActiveWinery(authOf(res).user, body.wineryId));
  }));
  return router;
}
