import { Router, type Request } from 'express';
import {
  addPlanLotInputSchema,
  approvePlanInputSchema,
  createPlanInputSchema,
  createTrainInputSchema,
  planListQuerySchema,
  updatePlanInputSchema,
  updatePlanLotInputSchema,
  updateTrainInputSchema,
} from '../../../shared/schemas/plans';
import { idParam } from '../../lib/params';
import { requireSignedIn } from '../../middleware/authenticate';
import { authorize, tenantOf } from '../../middleware/authorize';
import { idempotent } from '../../middleware/idempotency';
import { withBody, withQuery } from '../../middleware/validate';
import type { ModuleDeps } from '../module-deps';
import { createPlansService } from './plans.service';

/**
 * Bottling-day plans. Everyone reads ('plans:read'); owners, cellar masters and winemakers
 * draft and edit ('plans:draft'); owners and cellar masters approve, reopen and mark done
 * ('plans:approve').
 */
export function plansRoutes({ db, answers }: ModuleDeps) {
  const router = Router();
  const service = createPlansService(db);
  const read = [requireSignedIn, authorize(db, 'plans:read')];
  const draft = [requireSignedIn, authorize(db, 'plans:draft')];
  const approve = [requireSignedIn, authorize(db, 'plans:approve')];
  const planId = (req: Request) => idParam(req, 'id', 'Plan');
  const planLotId = (req: Request) => idParam(req, 'planLotId', 'Lot of this plan');
  const trainId = (req: Request) => idParam(req, 'trainId', 'Train');

  router.get('/plans', ...read, answers.reuse, withQuery(planListQuerySchema, async (_req, res, query) => {
    res.json(await service.list(tenantOf(res), query));
  }));
  router.post('/plans', ...draft, idempotent(db), withBody(createPlanInputSchema, async (_req, res, body) => {
    res.status(201).json(await service.create(tenantOf(res), body));
  }));
  router.get('/plans/:id', ...read, answers.reuse, async (req, res) => {
    res.json(await service.get(tenantOf(res), planId(req)));
  });
  router.patch('/plans/:id', ...draft, withBody(updatePlanInputSchema, async (req, res, body) => {
    res.json(await service.update(tenantOf(res), planId(req), body));
  }));
  router.delete('/plans/:id', ...draft, async (req, res) => {
    await service.remove(tenantOf(res), planId(req));
    res.status(204).end();
  });

  // Lots of the day, in order
  router.post('/plans/:id/lots', ...draft, idempotent(db), withBody(addPlanLotInputSchema, async (req, res, body) => {
    res.status(201).json(await service.addLot(tenantOf(res), planId(req), body));
  }));
  router.patch('/plans/:id/lots/:planLotId', ...draft, withBody(updatePlanLotInputSchema, async (req, res, body) => {
    res.json(await service.updateLot(tenantOf(res), planId(req), planLotId(req), body));
  }));
  router.delete('/plans/:id/lots/:planLotId', ...draft, async (req, res) => {
    res.json(await service.removeLot(tenantOf(res), planId(req), planLotId(req)));
  });

  // Train options of a lot
  router.post('/plans/:id/lots/:planLotId/trains', ...draft, idempotent(db), withBody(createTrainInputSchema, async (req, res, body) => {
    res.status(201).json(await service.addTrain(tenantOf(res), planId(req), planLotId(req), body));
  }));
  router.patch('/plans/:id/lots/:planLotId/trains/:trainId', ...draft, withBody(updateTrainInputSchema, async (req, res, body) => {
    res.json(await service.updateTrain(tenantOf(res), planId(req), planLotId(req), trainId(req), body));
  }));
  router.delete('/plans/:id/lots/:planLotId/trains/:trainId', ...draft, async (req, res) => {
    res.json(await service.deleteTrain(tenantOf(res), planId(req), planLotId(req), trainId(req)));
  });

  // Status
  router.post('/plans/:id/approve', ...approve, withBody(approvePlanInputSchema, async (req, res, body) => {
    res.json(await service.approve(tenantOf(res), planId(req), body));
  }));
  router.post('/plans/:id/reopen', ...approve, async (req, res) => {
    res.json(await service.reopen(tenantOf(res), planId(req)));
  });
  router.post('/plans/:id/done', ...approve, async (req, res) => {
    res.json(await service.markDone(tenantOf(res), planId(req)));
  });

  return router;
}
