import type { InvitationDto, MemberDto } from '../../../shared/types/api';
import type { Role } from '../../../shared/permissions';

export const presentMember = (m: { userId: string; name: string; email: string; role: Role; joinedAt: Date }): MemberDto => ({
  userId: m.userId,
  name: m.name,
  email: m.email,
  role: m.role,
  joinedAt: m.joinedAt.toISOString(),
});

export const presentInvitation = (i: {
  id: string;
  email: string;
  role: Role;
  invitedBy: string | null;
  expiresAt: Date;
  createdAt: Date;
}): InvitationDto => ({
  id: i.id,
  email: i.email,
  role: i.role,
  invitedBy: i.invitedBy,
  expiresAt: i.expiresAt.toISOString(),
  createdAt: i.createdAt.toISOString(),
});
