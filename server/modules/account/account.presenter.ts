import type { User } from 'lucia';
import type { MeDto, MembershipDto } from '../../../shared/types/api';

export function presentMe(user: User, memberships: MembershipDto[], activeWineryId: string | null): MeDto {
  return {
    user: { id: user.id, name: user.name, email: user.email, units: user.units },
    memberships: memberships.map((m) => ({ wineryId: m.wineryId, wineryName: m.wineryName, role: m.role })),
    activeWineryId,
  };
}
