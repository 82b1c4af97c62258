import { Router } from 'express';
import { authOf, requireSignedIn } from '../../middleware/authenticate';
import { authorize, tenantOf } from '../../middleware/authorize';
import { logger } from '../../lib/logger';
import type { ModuleDeps } from '../module-deps';
import { createExportService } from './export.service';

const slug = (name: string) =>
  name
    .normalize('NFKD')
    .replace(/[^\w\s-]/g, '')
    .trim()
    .replace(/\s+/g, '-')
    .toLowerCase()
    .slice(0, 60) || 'winery';

/** The owner's whole-winery export: one zip, streamed. */
export function exportRoutes({ db, storage }: ModuleDeps) {
  const router = Router();
  const service = createExportService({ db, storage });

  router.get('/export/winery', requireSignedIn, authorize(db, 'winery:export'), async (_req, res) => {
    const tenant = tenantOf(res);
    const name = await service.wineryName(tenant);
    const stamp = new Date().toISOString().slice(0, 10);
    res.set({
      'Content-Type': 'application/zip',
      'Content-Disposition': `attachment; filename="porewise-${slug(name)}-${stamp}.zip"`,
    });
    try {
      await service.writeZip(tenant, res, authOf(res).user.name);
    } catch (error) {
      if (!res.headersSent) throw error;
      // The zip is already on its way: cut it off, so the download fails visibly instead of ending short.
      logger.error({ err: error }, 'winery export failed mid-stream');
      res.destroy(error as Error);
    }
  });

  return router;
}
