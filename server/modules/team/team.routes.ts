import { Router } from 'express';
import { can } from '../../../shared/permissions';
import { uuidSchema } from '../../../shared/schemas/common';
import {
  acceptInvitationInputSchema,
  changeRoleInputSchema,
  createInvitationInputSchema,
  invitationTokenInputSchema,
} from '../../../shared/schemas/team';
import type { Database } from '../../db/client';
import type { Auth } from '../../lib/auth';
import { notFound } from '../../lib/errors';
import { authOf, requireSignedIn } from '../../middleware/authenticate';
import { authorize, tenantOf } from '../../middleware/authorize';
import { withBody } from '../../middleware/validate';
import type { TeamService } from './team.service';

/** Member ids are Lucia ids (lowercase base32); anything else cannot name a member. */
function memberIdParam(value: string | string[]) {
  if (typeof value !== "string") throw notFound("Member");
  if (!/^[a-z0-9]{1,64}$/.test(value)) throw notFound('Member');
  return value;
}

function invitationIdParam(value: string | string[]) {
  if (typeof value !== "string") throw notFound("Invitation");
  if (!uuidSchema.safeParse(value).success) throw notFound('Invitation');
  return value;
}

export function teamRoutes({ db, service }: { db: Database; service: TeamService }) {
  const router = Router();
  router.use(requireSignedIn);

  router.get('/', authorize(db, 'team:read'), async (_req, res) => {
    const tenant = tenantOf(res);
    res.json(await service.team(tenant, { includeInvitations: can(tenant.role, 'team:invite') }));
  });

  router.post('/invitations', authorize(db, 'team:invite'), withBody(createInvitationInputSchema, async (_req, res, body) => {
    res.status(201).json(await service.invite(tenantOf(res), authOf(res).user, body));
  }));

  router.delete('/invitations/:id', authorize(db, 'team:invite'), async (req, res) => {
    await service.revokeInvitation(tenantOf(res), invitationIdParam(req.params.id));
    res.status(204).end();
  });

  router.patch('/:userId', authorize(db, 'team:change-role'), withBody(changeRoleInputSchema, async (req, res, body) => {
    await service.changeRole(tenantOf(res), memberIdParam(req.params.userId), body.role);
    res.json(await service.team(tenantOf(res), { includeInvitations: true }));
  }));

  router.delete('/:userId', authorize(db, 'team:remove'), async (req, res) => {
    await service.removeMember(tenantOf(res), memberIdParam(req.params.userId));
    res.status(204).end();
  });

  return router;
}

export function invitationRoutes({ auth, service }: { auth: Auth; service: TeamService }) {
  const router = Router();
  router.post('/preview', withBody(invitationTokenInputSchema, async (_req, res, body) => {
    res.json(await service.preview(body.token));
  }));
  router.post('/accept', withBody(acceptInvitationInputSchema, async (_req, res, body) => {
    const signedIn = res.locals.auth ? authOf(res).user : null;
    const result = await service.accept(body, signedIn);
    if (result.sessionId) res.append('Set-Cookie', auth.createSessionCookie(result.sessionId).serialize());
    res.json({ wineryId: result.wineryId });
  }));
  return router;
}
