import { Router } from 'express';
import { requireSignedIn } from '../../middleware/authenticate';
import { authorize, tenantOf } from '../../middleware/authorize';
import type { ModuleDeps } from '../module-deps';
import { createTodayService } from './today.service';

/** The landing page's figures; every role that reads the cellar may read them. */
export function todayRoutes({ db, answers }: ModuleDeps) {
  const router = Router();
  const service = createTodayService(db);

  router.get('/today', requireSignedIn, authorize(db, 'cellar:read'), answers.reuse, async (_req, res) => {
    res.json(await service.today(tenantOf(res)));
  });

  return router;
}
