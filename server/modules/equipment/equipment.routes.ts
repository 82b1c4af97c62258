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
import { withBody, withQuery } from '../../middleware/validate';
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
  router.get('/housings', ...read, withQuery(housingListQuerySchema, async (_req, res, query) => {
    res.json(await service.listHousings(tenantOf(res), query));
  }));
  router.post('/housings', ...edit, idempotent(db), withBody(createHousingInputSchema, async (_req, res, body) => {
    res.status(201).json(await service.createHousing(tenantOf(res), body));
  }));
  router.get('/housings/:id', ...read, async (req, res) => {
    res.json(await service.housing(tenantOf(res), idParam(req, 'id', 'Housing')));
  });
  router.patch('/housings/:id', ...edit, withBody(updateHousingInputSchema, async (req, res, body) => {
    res.json(await service.updateHousing(tenantOf(res), idParam(req, 'id', 'Housing'), body));
  }));
  router.delete('/housings/:id', ...remove, async (req, res) => {
    await service.deleteHousing(tenantOf(res), idParam(req, 'id', 'Housing'));
    res.status(204).end();
  });

  // ---- bottling lines ---------------------------------------------------------------
  router.get('/lines', ...read, withQuery(lineListQuerySchema, async (_req, res, query) => {
    res.json(await service.listLines(tenantOf(res), query));
  }));
  router.post('/lines', ...edit, idempotent(db), withBody(createLineInputSchema, async (_req, res, body) => {
    res.status(201).json(await service.createLine(tenantOf(res), body));
  }));
  router.get('/lines/:id', ...read, async (req, res) => {
    res.json(await service.line(tenantOf(res), idParam(req, 'id', 'Bottling line')));
  });
  router.patch('/lines/:id', ...edit, withBody(updateLineInputSchema, async (req, res, body) => {
    res.json(await service.updateLine(tenantOf(res), idParam(req, 'id', 'Bottling line'), body));
  }));
  router.delete('/lines/:id', ...remove, async (req, res) => {
    await service.deleteLine(tenantOf(res), idParam(req, 'id', 'Bottling line'));
    res.status(204).end();
  });

  // ---- cartridge types --------------------------------------------------------------
  router.get('/cartridge-types', ...read, withQuery(cartridgeTypeListQuerySchema, async (_req, res, query) => {
    res.json(await service.listCartridgeTypes(tenantOf(res), query));
  }));
  router.post('/cartridge-types', ...edit, idempotent(db), withBody(createCartridgeTypeInputSchema, async (_req, res, body) => {
    res.status(201).json(await service.createCartridgeType(tenantOf(res), body));
  }));
  router.get('/cartridge-types/:id', ...read, async (req, res) => {
    res.json(await service.cartridgeType(tenantOf(res), idParam(req, 'id', 'Cartridge type')));
  });
  router.patch('/cartridge-types/:id', ...edit, withBody(updateCartridgeTypeInputSchema, async (req, res, body) => {
    res.json(await service.updateCartridgeType(tenantOf(res), idParam(req, 'id', 'Cartridge type'), body));
  }));
  router.delete('/cartridge-types/:id', ...remove, async (req, res) => {
    await service.deleteCartridgeType(tenantOf(res), idParam(req, 'id', 'Cartridge type'));
    res.status(204).end();
  });

  return router;
}
