import { Router } from 'express';
import type { Action } from '../../../shared/permissions';
import { idParam } from '../../lib/params';
import { requireSignedIn } from '../../middleware/authenticate';
import { authorize, tenantOf } from '../../middleware/authorize';
import type { ModuleDeps } from '../module-deps';
import type { ArchivableKind } from './archive.repository';
import { createArchiveService } from './archive.service';

/** Who may archive each kind: whoever may edit it. */
const archiveAction: Record<ArchivableKind, Action> = {
  lots: 'cellar:edit',
  plans: 'plans:draft',
  cartridges: 'cartridges:register',
  housings: 'equipment:edit',
  'cartridge-types': 'equipment:edit',
};

/** `POST /api/<kind>/:id/archive` and `/unarchive` for lots, plans, cartridges, housings and cartridge types. */
export function archiveRoutes({ db }: ModuleDeps) {
  const router = Router();
  const service = createArchiveService(db);
  for (const kind of Object.keys(archiveAction) as ArchivableKind[]) {
    const guard = [requireSignedIn, authorize(db, archiveAction[kind])];
    router.post(`/${kind}/:id/archive`, ...guard, async (req, res) => {
      res.json(await service.setArchived(tenantOf(res), kind, idParam(req, 'id', 'Record'), true));
    });
    router.post(`/${kind}/:id/unarchive`, ...guard, async (req, res) => {
      res.json(await service.setArchived(tenantOf(res), kind, idParam(req, 'id', 'Record'), false));
    });
  }
  return router;
}
