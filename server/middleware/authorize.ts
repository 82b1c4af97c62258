import type { RequestHandler, Response } from 'express';
import { and, eq } from 'drizzle-orm';
import { can, type Action, type Role } from '../../shared/permissions';
import type { Database } from '../db/client';
import { membershipsTable } from '../db/schema';
import { forbidden } from '../lib/errors';
import { authOf } from './authenticate';

/** `userName` is the person's name now, kept on records so removing a member never blanks "who". */
export type TenantContext = { wineryId: string; role: Role; userId: string; userName?: string };

/**
 * Every winery-scoped route declares the action it needs. The winery is the signed-in
 * person's active winery; their role there must allow the action (403 otherwise).
 */
export function authorize(db: Database, action: Action): RequestHandler {
  return async (_req, res, next) => {
    const { user } = authOf(res);
    if (!user.activeWineryId) throw forbidden('Join or create a winery first.');
    const [membership] = await db
      .select({ role: membershipsTable.role })
      .from(membershipsTable)
      .where(and(eq(membershipsTable.userId, user.id), eq(membershipsTable.wineryId, user.activeWineryId)));
    if (!membership) throw forbidden('You are no longer a member of this winery.');
    if (!can(membership.role, action)) throw forbidden();
    res.locals.tenant = { wineryId: user.activeWineryId, role: membership.role, userId: user.id, userName: user.name } satisfies TenantContext;
    next();
  };
}

export function tenantOf(res: Response): TenantContext {
  const tenant = res.locals.tenant as TenantContext | undefined;
  if (!tenant) throw forbidden();
  return tenant;
}
