import { Router } from 'express';
import multer from 'multer';
import { ATTACHMENT_MAX_BYTES, attachmentOwnerSchema } from '../../../shared/schemas/attachments';
import { badRequest } from '../../lib/errors';
import { idParam } from '../../lib/params';
import { requireSignedIn } from '../../middleware/authenticate';
import { authorize, tenantOf } from '../../middleware/authorize';
import { parseOrThrow } from '../../middleware/validate';
import type { ModuleDeps } from '../module-deps';
import { createAttachmentsService } from './attachments.service';

const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: ATTACHMENT_MAX_BYTES, files: 1, fields: 5 } });

export function attachmentsRoutes({ db, storage }: ModuleDeps) {
  const router = Router();
  const service = createAttachmentsService({ db, storage });

  router.get('/attachments', requireSignedIn, authorize(db, 'attachments:read'), async (req, res) => {
    const owner = parseOrThrow(attachmentOwnerSchema, req.query);
    res.json({ items: await service.list(tenantOf(res), owner) });
  });

  router.post('/attachments', requireSignedIn, authorize(db, 'attachments:upload'), upload.single('file'), async (req, res) => {
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
