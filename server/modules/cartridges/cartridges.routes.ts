import express, { Router, type RequestHandler } from 'express';
import multer from 'multer';
import {
  cartridgeListQuerySchema,
  createCartridgeInputSchema,
  IMPORT_MAX_BYTES,
  importQuerySchema,
  installCartridgeInputSchema,
  retireCartridgeInputSchema,
  updateCartridgeInputSchema,
} from '../../../shared/schemas/cartridges';
import { badRequest, HttpError } from '../../lib/errors';
import { idParam } from '../../lib/params';
import { requireSignedIn } from '../../middleware/authenticate';
import { authorize, tenantOf } from '../../middleware/authorize';
import { idempotent } from '../../middleware/idempotency';
import { parseOrThrow, withBody, withQuery } from '../../middleware/validate';
import type { ModuleDeps } from '../module-deps';
import { createCartridgesService } from './cartridges.service';

const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: IMPORT_MAX_BYTES, files: 1, fields: 10 } });
const csvText = express.text({ type: ['text/csv', 'text/plain', 'application/csv', 'application/vnd.ms-excel'], limit: IMPORT_MAX_BYTES });

/** CSV bytes as text: UTF-8, or Windows-1252 (what spreadsheet programs in Europe often save). */
function decodeCsv(bytes: Uint8Array): string {
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    return new TextDecoder('windows-1252').decode(bytes);
  }
}

/** The delivery file: multipart field "file", or the CSV itself as a text/csv body. */
const readCsv: RequestHandler = (req, res, next) => {
  upload.single('file')(req, res, (err: unknown) => {
    if (err instanceof multer.MulterError) {
      if (err.code === 'LIMIT_FILE_SIZE') return next(new HttpError(413, 'too_large', `The file is larger than ${IMPORT_MAX_BYTES / 1024 / 1024} MB. Split the delivery into smaller files.`));
      return next(badRequest(`Send the delivery list as one file in the field "file" (${err.message}).`));
    }
    if (err) return next(err instanceof HttpError ? err : badRequest('The upload is not in the expected form (one CSV file in the field "file").'));
    if (req.file) {
      res.locals.csv = decodeCsv(req.file.buffer);
      return next();
    }
    csvText(req, res, (textErr: unknown) => {
      if (textErr) {
        const e = textErr as { type?: string };
        if (e.type === 'entity.too.large') return next(new HttpError(413, 'too_large', `The CSV text is larger than ${IMPORT_MAX_BYTES / 1024 / 1024} MB.`));
        return next(textErr);
      }
      if (typeof req.body === 'string') {
        res.locals.csv = req.body;
        return next();
      }
      next(badRequest('Attach the delivery list as a CSV file (field "file") or send it as text/csv.', { file: 'Choose a CSV file.' }));
    });
  });
};

/**
 * /api/cartridges: the inventory, stock summary, housing view, moves and delivery import.
 * Reads need 'cartridges:read'; registering, editing, retiring and importing need
 * 'cartridges:register' (owner, cellar master); install and remove need 'cartridges:move'
 * (also technicians, who do the physical work). Retiring is a decision about the record,
 * not a move of the day, so it sits with registering.
 */
export function cartridgesRoutes({ db, answers }: ModuleDeps) {
  const router = Router();
  const service = createCartridgesService(db);
  const read = [requireSignedIn, authorize(db, 'cartridges:read')];
  const register = [requireSignedIn, authorize(db, 'cartridges:register')];
  const moveGuard = [requireSignedIn, authorize(db, 'cartridges:move')];

  router.get('/cartridges', ...read, answers.reuse, withQuery(cartridgeListQuerySchema, async (_req, res, query) => {
    res.json(await service.list(tenantOf(res), query));
  }));

  router.get('/cartridges/summary', ...read, async (_req, res) => {
    res.json(await service.summary(tenantOf(res)));
  });

  router.get('/cartridges/housing-view', ...read, async (_req, res) => {
    res.json(await service.housingView(tenantOf(res)));
  });

  router.post('/cartridges/import', ...register, (req, res, next) => {
    const { dryRun } = parseOrThrow(importQuerySchema, req.query);
    res.locals.dryRun = dryRun;
    // A dry run saves nothing, so only the real import remembers its Idempotency-Key.
    if (dryRun) return next();
    return idempotent(db)(req, res, next);
  }, readCsv, async (_req, res) => {
    const tenant = tenantOf(res);
    const csv = res.locals.csv as string;
    if (res.locals.dryRun) res.json(await service.previewImport(tenant, csv));
    else res.status(201).json(await service.importDelivery(tenant, csv));
  });

  router.post('/cartridges', ...register, idempotent(db), withBody(createCartridgeInputSchema, async (_req, res, body) => {
    res.status(201).json(await service.register(tenantOf(res), body));
  }));

  router.get('/cartridges/:id', ...read, answers.reuse, async (req, res) => {
    res.json(await service.detail(tenantOf(res), idParam(req, 'id', 'Cartridge')));
  });

  router.patch('/cartridges/:id', ...register, withBody(updateCartridgeInputSchema, async (req, res, body) => {
    res.json(await service.update(tenantOf(res), idParam(req, 'id', 'Cartridge'), body));
  }));

  router.post('/cartridges/:id/install', ...moveGuard, withBody(installCartridgeInputSchema, async (req, res, body) => {
    res.json(await service.install(tenantOf(res), idParam(req, 'id', 'Cartridge'), body));
  }));

  router.post('/cartridges/:id/remove', ...moveGuard, async (req, res) => {
    res.json(await service.remove(tenantOf(res), idParam(req, 'id', 'Cartridge')));
  });

  router.post('/cartridges/:id/retire', ...register, withBody(retireCartridgeInputSchema, async (req, res, body) => {
    res.json(await service.retire(tenantOf(res), idParam(req, 'id', 'Cartridge'), body));
  }));
  // Only a cartridge registered by mistake goes: one with a run or care history is 409 in_record (archive it instead).
  router.delete('/cartridges/:id', requireSignedIn, authorize(db, 'records:delete'), async (req, res) => {
    await service.deleteUnused(tenantOf(res), idParam(req, 'id', 'Cartridge'));
    res.status(204).end();
  });

  return router;
}
