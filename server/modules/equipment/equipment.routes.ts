import { Router } from 'express';
import {
  cartridgeTypeListQuerySchema,
  createCartridgeTypeInputSchema,
  createHousingInputSchema,
  createLineInputSchema,
  housingListQuerySchema,
  lineListQuerySchema,
  updateCartridgeTypeInputSchema,
  updateHousingInputSchema,
  updateLineInputSchema,
} from '../../../shared/schemas/equipment';
import { idParam } from '../../lib/params';
import { requireSignedIn } from '../../middleware/authenticate';
import { authorize, tenantOf } from '../../middleware/authorize';
import { idempotent } from '../../middleware/idempotency';
import { validateBody, validateQuery } from '../../middleware/validate';
import type { ModuleDeps } from '../module-deps';
import { createEquipmentService } from './equipment.service';

/**
 * Housings, bottling lines and cartridge types of the active winery. Everyone reads
 * ('equipment:read'); owners and cellar masters write ('equipment:edit').
 */
export function equipmentRoutes({ db }: ModuleDeps) {
  const router = Router();
  const service = createEquipmentService(db);
  const read = [requireSignedIn, authorize(db, 'equipment:read')];
  const edit = [requireSignedIn, authorize(db, 'equipment:edit')];
  // Deleting records is the owner's (roles table).
  const remove = [requireSignedIn, authorize(db, 'records:delete')];

  // ---- housings ---------------------------------------------------------------------
  router.get('/housings', ...read, validateQuery(housingListQuerySchema), async (_req, res) => {
    res.json(await service.listHousings(tenantOf(res), res.locals.query));
  });
  router.post('/housings', ...edit, idempotent(db), validateBody(createHousingInputSchema), async (_req, res) => {
    res.status(201).json(await service.createHousing(tenantOf(res), res.locals.body));
  });
  router.get('/housings/:id', ...read, async (req, res) => {
    res.json(await service.housing(tenantOf(res), idParam(req, 'id', 'Housing')));
  });
  router.patch('/housings/:id', ...edit, validateBody(updateHousingInputSchema), async (req, res) => {
    res.json(await service.updateHousing(tenantOf(res), idParam(req, 'id', 'Housing'), res.locals.body));
  });
  router.delete('/housings/:id', ...remove, async (req, res) => {
    await service.deleteHousing(tenantOf(res), idParam(req, 'id', 'Housing'));
    res.status(204).end();
  });

  // ---- bottling lines ---------------------------------------------------------------
  router.get('/lines', ...read, validateQuery(lineListQuerySchema), async (_req, res) => {
    res.json(await service.listLines(tenantOf(res), res.locals.query));
  });
  router.post('/lines', ...edit, idempotent(db), validateBody(createLineInputSchema), async (_req, res) => {
    res.status(201).json(await service.createLine(tenantOf(res), res.locals.body));
  });
  router.get('/lines/:id', ...read, async (req, res) => {
    res.json(await service.line(tenantOf(res), idParam(req, 'id', 'Bottling line')));
  });
  router.patch('/lines/:id', ...edit, validateBody(updateLineInputSchema), async (req, res) => {
    res.json(await service.updateLine(tenantOf(res), idParam(req, 'id', 'Bottling line'), res.locals.body));
  });
  router.delete('/lines/:id', ...remove, async (req, res) => {
    await service.deleteLine(tenantOf(res), idParam(req, 'id', 'Bottling line'));
    res.status(204).end();
  });

  // ---- cartridge types --------------------------------------------------------------
  router.get('/cartridge-types', ...read, validateQuery(cartridgeTypeListQuerySchema), async (_req, res) => {
    res.json(await service.listCartridgeTypes(tenantOf(res), res.locals.query));
  });
  router.post('/cartridge-types', ...edit, idempotent(db), validateBody(createCartridgeTypeInputSchema), async (_req, res) => {
    res.status(201).json(await service.createCartridgeType(tenantOf(res), res.locals.body));
  });
  router.get('/cartridge-types/:id', ...read, async (req, res) => {
    res.json(await service.cartridgeType(tenantOf(res), idParam(req, 'id', 'Cartridge type')));
  });
  router.patch('/cartridge-types/:id', ...edit, validateBody(updateCartridgeTypeInputSchema), async (req, res) => {
    res.json(await service.updateCartridgeType(tenantOf(res), idParam(req, 'id', 'Cartridge type'), res.locals.body));
  });
  router.delete('/cartridge-types/:id', ...remove, async (req, res) => {
    await service.deleteCartridgeType(tenantOf(res), idParam(req, 'id', 'Cartridge type'));
    res.status(204).end();
  });

  return router;
}
