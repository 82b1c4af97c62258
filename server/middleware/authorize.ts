import type { RequestHandler, Response } from 'express';
import { can, type Action, type Role } from '../../shared/permissions';
import type { Database } from '../db/client';
import { forbidden } from '../lib/errors';
import { authOf } from './authenticate';

/** `userName` is the person's name now, kept on records so removing a member never blanks "who". */
export type TenantContext = { wineryId: string; role: Role; userId: string; userName?: string };

/**
 * Every winery-scoped route declares the action it needs. The winery is the signed-in
 * person's active winery; their role there must allow the action (403 otherwise). The role
 * comes with the session, read in the same query on this request (server/lib/auth.ts).
 */
export function authorize(_db: Database, action: Action): RequestHandler {
  return (_req, res, next) => {
    const { user } = authOf(res);
    if (!user.activeWineryId) throw forbidden('Join or create a winery first.');
    const role = user.activeRole;
    if (!role) throw forbidden('You are no longer a member of this winery.');
    if (!can(role, action)) throw forbidden();
    res.locals.tenant = { wineryId: user.activeWineryId, role, userId: user.id, userName: user.name } satisfies TenantContext;
    next();
  };
}

export function tenantOf(res: Response): TenantContext {
  const tenant = res.locals.tenant as TenantContext | undefined;
  if (!tenant) throw forbidden();
  return tenant;
}
