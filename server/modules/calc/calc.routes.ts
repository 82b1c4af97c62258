import { Router } from 'express';
import { cartridgeLifeInputSchema, filterabilityInputSchema, fitRunInputSchema, sizeTrainInputSchema } from '../../../shared/schemas/calc';
import type { Database } from '../../db/client';
import { requireSignedIn } from '../../middleware/authenticate';
import { authorize } from '../../middleware/authorize';
import { validateBody } from '../../middleware/validate';
import { calcService } from './calc.service';

/** The engine over HTTP for integrations: signed-in members of a winery; nothing is stored. */
export function calcRoutes({ db }: { db: Database }) {
  const router = Router();
  router.use(requireSignedIn, authorize(db, 'calc:use'));
  router.post('/size-train', validateBody(sizeTrainInputSchema), (_req, res) => {
    res.json(calcService.sizeTrain(res.locals.body));
  });
  router.post('/fit-run', validateBody(fitRunInputSchema), (_req, res) => {
    res.json(calcService.fitRun(res.locals.body));
  });
  router.post('/filterability', validateBody(filterabilityInputSchema), (_req, res) => {
    res.json(calcService.filterability(res.locals.body));
  });
  router.post('/cartridge-life', validateBody(cartridgeLifeInputSchema), (_req, res) => {
    res.json(calcService.cartridgeLife(res.locals.body));
  });
  return router;
}
