import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import {
  LOGGER_FILE_MAX_BYTES,
  loggerImportFieldsSchema,
  loggerImportQuerySchema,
  loggerProfileInputSchema,
  loggerProfilePatchSchema,
} from '../../../shared/schemas/logger';
import { badRequest, HttpError } from '../../lib/errors';
import { idParam } from '../../lib/params';
import { requireSignedIn } from '../../middleware/authenticate';
import { authorize, tenantOf } from '../../middleware/authorize';
import { idempotent } from '../../middleware/idempotency';
import { parseOrThrow, withBody } from '../../middleware/validate';
import type { ModuleDeps } from '../module-deps';
import { createLoggerService } from './logger.service';

const MB = LOGGER_FILE_MAX_BYTES / 1024 / 1024;
const multerUpload = multer({ storage: multer.memoryStorage(), limits: { fileSize: LOGGER_FILE_MAX_BYTES, files: 1, fields: 5, fieldSize: 64 * 1024 } }).single('file');

/** One logger file in the field "file"; too large is 413, a malformed form 400. */
const upload: RequestHandler = (req, res, next) => {
  multerUpload(req, res, (err: unknown) => {
    if (!err) return next();
    if (err instanceof multer.MulterError && err.code === 'LIMIT_FILE_SIZE') {
      return next(new HttpError(413, 'too_large', `Logger files can be at most ${String(MB)} MB.`, { file: `At most ${String(MB)} MB: split the file.` }));
    }
    next(badRequest('The upload is not in the expected form (one file in the field “file”, with stageIndex and a profile or mapping).'));
  });
};

/**
 * Logger profiles (how to read one logger's export) and logger files imported into a run's
 * stage. Everyone reads profiles ('runs:read'); those who log readings ('runs:log') save,
 * change and delete profiles and import files.
 */
export function loggerRoutes({ db, storage }: ModuleDeps) {
  const router = Router();
  const service = createLoggerService({ db, storage });
  const read = [requireSignedIn, authorize(db, 'runs:read')];
  const log = [requireSignedIn, authorize(db, 'runs:log')];

  router.get('/logger-profiles', ...read, async (_req, res) => {
    res.json(await service.listProfiles(tenantOf(res)));
  });
  router.post('/logger-profiles', ...log, idempotent(db), withBody(loggerProfileInputSchema, async (_req, res, body) => {
    res.status(201).json(await service.createProfile(tenantOf(res), body));
  }));
  router.patch('/logger-profiles/:id', ...log, withBody(loggerProfilePatchSchema, async (req, res, body) => {
    res.json(await service.updateProfile(tenantOf(res), idParam(req, 'id', 'Logger profile'), body));
  }));
  router.delete('/logger-profiles/:id', ...log, async (req, res) => {
    await service.removeProfile(tenantOf(res), idParam(req, 'id', 'Logger profile'));
    res.status(204).end();
  });

  // Multipart: file, stageIndex, and profileId or mapping (JSON). `?dryRun=true` previews.
  router.post('/runs/:id/readings/import', ...log, upload, async (req, res) => {
    const runId = idParam(req, 'id', 'Run');
    // Another winery's run or a missing one is a 404 whatever the form holds.
    await service.requireRun(tenantOf(res), runId);
    const query = parseOrThrow(loggerImportQuerySchema, req.query ?? {});
    const fields = parseOrThrow(loggerImportFieldsSchema, req.body ?? {});
    if (!req.file) throw badRequest('Choose the logger file.', { file: 'Choose the logger file (CSV or TSV).' });
    // Browsers send multipart file names as latin1; recover UTF-8 names.
    const originalName = Buffer.from(req.file.originalname, 'latin1').toString('utf8');
    const dryRun = query.dryRun === 'true' || query.dryRun === '1';
    res.json(await service.importFile(tenantOf(res), runId, { buffer: req.file.buffer, originalName }, fields, { dryRun }));
  });

  return router;
}
