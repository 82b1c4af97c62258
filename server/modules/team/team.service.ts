import { generateIdFromEntropySize, type User } from 'lucia';
import { roleLabels, type Role } from '../../../shared/permissions';
import { INVITATION_DAYS, type AcceptInvitationInput, type CreateInvitationInput } from '../../../shared/schemas/team';
import type { InvitationPreviewDto, TeamDto } from '../../../shared/types/api';
import type { Database } from '../../db/client';
import type { Auth } from '../../lib/auth';
import { badRequest, conflict, forbidden, gone, notFound } from '../../lib/errors';
import type { Mailer } from '../../lib/mail';
import { hashPassword } from '../../lib/passwords';
import { createToken, hashToken } from '../../lib/tokens';
import type { TenantContext } from '../../middleware/authorize';
import { accountsIn } from '../auth/auth.service';
import { presentInvitation, presentMember } from './team.presenter';
import { createTeamRepository } from './team.repository';
import { audited, recordChange } from '../audit/audit.service';

type Deps = { db: Database; auth: Auth; mailer: Mailer; appUrl: string };

const lastOwnerMessage = 'A winery needs at least one owner. Make someone else an owner first.';

export function createTeamService({ db, auth, mailer, appUrl }: Deps) {
  const repo = createTeamRepository(db);

  async function findInvitation(token: string) {
    const found = await repo.invitationByTokenHash(await hashToken(token));
    if (!found || found.invitation.revokedAt) throw notFound('Invitation');
    return found;
  }

  return {
    async team(tenant: TenantContext, opts: { includeInvitations: boolean }, now = new Date()): Promise<TeamDto> {
      const [members, invitations] = await Promise.all([
        repo.members(tenant.wineryId),
        opts.includeInvitations ? repo.pendingInvitations(tenant.wineryId, now) : Promise.resolve([]),
      ]);
      return { members: members.map(presentMember), invitations: invitations.map(presentInvitation) };
    },

    /** Invites by e-mail. Inviting the same address again renews the one pending invitation (idempotent). */
    async invite(tenant: TenantContext, inviter: User, input: CreateInvitationInput, now = new Date()) {
      const token = createToken();
      const tokenHash = await hashToken(token);
      const expiresAt = new Date(now.getTime() + INVITATION_DAYS * 86_400_000);
      const link = `${appUrl}/invitation?token=${encodeURIComponent(token)}`;
      // The invitation and its mail job commit together.
      const invitation = await db.transaction(async (tx) => {
        const txRepo = createTeamRepository(tx);
        if (await txRepo.memberByEmail(tenant.wineryId, input.email)) {
          throw conflict(`${input.email} is already a member of this winery.`, 'already_member');
        }
        const pending = await txRepo.pendingInvitationFor(tenant.wineryId, input.email, now);
        const invitation = pending
          ? await txRepo.renewInvitation(pending.id, { tokenHash, role: input.role, expiresAt, invitedBy: inviter.id })
          : await txRepo.insertInvitation({ wineryId: tenant.wineryId, email: input.email, role: input.role, tokenHash, invitedBy: inviter.id, expiresAt });
        await recordChange(tx, tenant, { action: 'invite', kind: 'invitation', id: invitation.id });
        const wineryName = await txRepo.wineryName(tenant.wineryId);
        await mailer.send(
          {
            to: input.email,
            subject: `${inviter.name} invited you to ${wineryName} on Porewise`,
            text:
              `Hello,\n\n${inviter.name} invited you to join ${wineryName} on Porewise as ${roleLabels[input.role].toLowerCase()}.\n` +
              `Open this link within ${INVITATION_DAYS} days to accept:\n\n${link}\n\n` +
              `If you did not expect this, you can ignore this message.\n`,
          },
          { db: tx, wineryId: tenant.wineryId },
        );
        return invitation;
      });
      return presentInvitation({ ...invitation, invitedBy: inviter.name });
    },

    async revokeInvitation(tenant: TenantContext, invitationId: string, now = new Date()) {
      if (!(await audited(db, tenant, { action: 'revoke', kind: 'invitation', id: invitationId }, (tx) => createTeamRepository(tx).revokeInvitation(tenant.wineryId, invitationId, now)))) {
        throw notFound('Invitation');
      }
    },

    async changeRole(tenant: TenantContext, userId: string, role: Role) {
      await db.transaction(async (tx) => {
        const txRepo = createTeamRepository(tx);
        const member = await txRepo.member(tenant.wineryId, userId);
        if (!member) throw notFound('Member');
        if (member.role === 'owner' && role !== 'owner' && (await txRepo.ownerCount(tenant.wineryId)) <= 1) {
          throw conflict(lastOwnerMessage, 'last_owner');
        }
        await audited(tx, tenant, { action: 'update', kind: 'member', id: userId }, () => txRepo.setRole(tenant.wineryId, userId, role));
      });
    },

    async removeMember(tenant: TenantContext, userId: string) {
      await db.transaction(async (tx) => {
        const txRepo = createTeamRepository(tx);
        const member = await txRepo.member(tenant.wineryId, userId);
        if (!member) throw notFound('Member');
        if (member.role === 'owner' && (await txRepo.ownerCount(tenant.wineryId)) <= 1) {
          throw conflict(lastOwnerMessage, 'last_owner');
        }
        await audited(tx, tenant, { action: 'remove', kind: 'member', id: userId }, () => txRepo.removeMember(tenant.wineryId, userId));
      });
    },

    async preview(token: string, now = new Date()): Promise<InvitationPreviewDto> {
      const { invitation, wineryName } = await findInvitation(token);
      if (invitation.acceptedAt) throw gone('This invitation has already been used.');
      if (invitation.expiresAt <= now) throw gone('This invitation has expired. Ask the owner to invite you again.');
      const accountExists = Boolean(await accountsIn(db).findByEmail(invitation.email));
      return { wineryName, role: invitation.role, email: invitation.email, accountExists, expiresAt: invitation.expiresAt.toISOString() };
    },

    /**
     * Accepts an invitation. Signed in: the invited address must be theirs. Not signed in: a new
     * account is created with the given name and password. Accepting twice is harmless.
     * Returns a new session id when an account was created.
     */
    async accept(input: AcceptInvitationInput, signedIn: User | null, now = new Date()) {
      const { invitation } = await findInvitation(input.token);
      if (invitation.acceptedAt) {
        if (signedIn && invitation.acceptedBy === signedIn.id) return { wineryId: invitation.wineryId, sessionId: null };
        throw gone('This invitation has already been used.');
      }
      if (invitation.expiresAt <= now) throw gone('This invitation has expired. Ask the owner to invite you again.');

      if (signedIn) {
        if (signedIn.email !== invitation.email) {
          throw forbidden(`This invitation is for ${invitation.email}. Sign out and sign in as that person, or ask for a new invitation.`);
        }
        await db.transaction(async (tx) => {
          // Claim the invitation first: a revoke or a second accept in between wins no race.
          if (!(await createTeamRepository(tx).markAccepted(invitation.id, signedIn.id, now))) throw gone('This invitation can no longer be used.');
          await createTeamRepository(tx).addMember(invitation.wineryId, signedIn.id, invitation.role);
          await accountsIn(tx).setActiveWinery(signedIn.id, invitation.wineryId);
          await recordChange(tx, { wineryId: invitation.wineryId, userId: signedIn.id }, { action: 'join', kind: 'member', id: signedIn.id });
        });
        return { wineryId: invitation.wineryId, sessionId: null };
      }

      if (await accountsIn(db).findByEmail(invitation.email)) {
        throw conflict('You already have a Porewise account. Sign in, then open the invitation link again.', 'sign_in_required');
      }
      const fields: Record<string, string> = {};
      if (!input.name) fields.name = 'Enter your name.';
      if (!input.password) fields.password = 'Choose a password.';
      if (Object.keys(fields).length) throw badRequest('Check the highlighted fields.', fields);
      const passwordHash = await hashPassword(input.password!);
      const userId = generateIdFromEntropySize(10);
      await db.transaction(async (tx) => {
        const user = await accountsIn(tx).create({ id: userId, email: invitation.email, name: input.name!, passwordHash, activeWineryId: invitation.wineryId });
        if (!user) throw conflict('You already have a Porewise account. Sign in, then open the invitation link again.', 'sign_in_required');
        if (!(await createTeamRepository(tx).markAccepted(invitation.id, userId, now))) throw gone('This invitation can no longer be used.');
        await createTeamRepository(tx).addMember(invitation.wineryId, userId, invitation.role);
        await recordChange(tx, { wineryId: invitation.wineryId, userId }, { action: 'join', kind: 'member', id: userId });
      });
      const session = await auth.createSession(userId, {});
      return { wineryId: invitation.wineryId, sessionId: session.id };
    },
  };
}
export type TeamService = ReturnType<typeof createTeamService>;
