import { Router } from 'express';
import { cartridgeLifeInputSchema, filterabilityInputSchema, fitRunInputSchema, sizeTrainInputSchema } from '../../../shared/schemas/calc';
import type { Database } from '../../db/client';
import { requireSignedIn } from '../../middleware/authenticate';
import { authorize } from '../../middleware/authorize';
import { withBody } from '../../middleware/validate';
import { calcService } from './calc.service';

/** The engine over HTTP for integrations: signed-in members of a winery; nothing is stored. */
export function calcRoutes({ db }: { db: Database }) {
  const router = Router();
  router.use(requireSignedIn, authorize(db, 'calc:use'));
  router.post('/size-train', withBody(sizeTrainInputSchema, (_req, res, body) => {
    res.json(calcService.sizeTrain(body));
  }));
  router.post('/fit-run', withBody(fitRunInputSchema, (_req, res, body) => {
    res.json(calcService.fitRun(body));
  }));
  router.post('/filterability', withBody(filterabilityInputSchema, (_req, res, body) => {
    res.json(calcService.filterability(body));
  }));
  router.post('/cartridge-life', withBody(cartridgeLifeInputSchema, (_req, res, body) => {
    res.json(calcService.cartridgeLife(body));
  }));
  return router;
}
