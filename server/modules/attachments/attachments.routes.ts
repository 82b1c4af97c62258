import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import { ATTACHMENT_MAX_BYTES, attachmentOwnerSchema } from '../../../shared/schemas/attachments';
import { badRequest } from '../../lib/errors';
import { idParam } from '../../lib/params';
import { requireSignedIn } from '../../middleware/authenticate';
import { authorize, tenantOf } from '../../middleware/authorize';
import { parseOrThrow } from '../../middleware/validate';
import type { ModuleDeps } from '../module-deps';
import { createAttachmentsService } from './attachments.service';

const multerUpload = multer({ storage: multer.memoryStorage(), limits: { fileSize: ATTACHMENT_MAX_BYTES, files: 1, fields: 5 } }).single('file');

/** One file in the field "file"; a malformed multipart body is the sender's error (400), not ours. */
const upload: RequestHandler = (req, res, next) => {
  multerUpload(req, res, (err: unknown) => {
    if (!err) return next();
    if (err instanceof multer.MulterError) return next(err);
    next(badRequest('The upload is not in the expected form (one file in the field “file”).'));
  });
};

export function attachmentsRoutes({ db, storage }: ModuleDeps) {
  const router = Router();
  const service = createAttachmentsService({ db, storage });

  router.get('/attachments', requireSignedIn, authorize(db, 'attachments:read'), async (req, res) => {
    const owner = parseOrThrow(attachmentOwnerSchema, req.query);
    res.json({ items: await service.list(tenantOf(res), owner) });
  });

  router.post('/attachments', requireSignedIn, authorize(db, 'attachments:upload'), upload, async (req, res) => {
    const owner = parseOrThrow(attachmentOwnerSchema, req.body ?? {});
    if (!req.file) throw badRequest('Choose a file to attach.', { file: 'Choose a file to attach.' });
    // Browsers send multipart file names as latin1; recover UTF-8 names.
    const originalName = Buffer.from(req.file.originalname, 'latin1').toString('utf8');
    res.status(201).json(await service.upload(tenantOf(res), owner, { originalName, buffer: req.file.buffer }));
  });

  router.get('/attachments/:id/download', requireSignedIn, authorize(db, 'attachments:read'), async (req, res) => {
    const { row, body } = await service.download(tenantOf(res), idParam(req, 'id', 'Attachment'));
    res.set({
      'Content-Type': row.contentType,
      'Content-Length': String(body.byteLength),
      'Content-Disposition': `attachment; filename="${row.fileName.replace(/"/g, '')}"; filename*=UTF-8''${encodeURIComponent(row.fileName)}`,
      'Cache-Control': 'private, no-store',
    });
    res.end(Buffer.from(body));
  });

  router.delete('/attachments/:id', requireSignedIn, authorize(db, 'attachments:upload'), async (req, res) => {
    await service.remove(tenantOf(res), idParam(req, 'id', 'Attachment'));
    res.status(204).end();
  });

  return router;
}
