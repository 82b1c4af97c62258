import type { User } from 'lucia';
import type { UpdateMeInput } from '../../../shared/schemas/auth';
import type { Database } from '../../db/client';
import { notFound } from '../../lib/errors';
import { createAccountRepository } from './account.repository';
import { presentMe } from './account.presenter';

export function createAccountService({ db }: { db: Database }) {
  const repo = createAccountRepository(db);
  return {
    /** The person, their wineries and the active one (repaired if they left it). */
    async me(user: User) {
      const memberships = await repo.membershipsOf(user.id);
      let active = user.activeWineryId;
      if (!memberships.some((m) => m.wineryId === active)) {
        active = memberships[0]?.wineryId ?? null;
        await repo.updateUser(user.id, { activeWineryId: active });
      }
      return presentMe(user, memberships, active);
    },
    async update(user: User, input: UpdateMeInput) {
      await repo.updateUser(user.id, { name: input.name, units: input.units });
      return this.me({ ...user, name: input.name ?? user.name, units: input.units ?? user.units });
    },
    /** Switches winery; a winery the person does not belong to is reported as not found. */
    async setActiveWinery(user: User, wineryId: string) {
      const memberships = await repo.membershipsOf(user.id);
      if (!memberships.some((m) => m.wineryId === wineryId)) throw notFound('Winery');
      await repo.updateUser(user.id, { activeWineryId: wineryId });
      return presentMe(user, memberships, wineryId);
    },
  };
}
export type AccountService = ReturnType<typeof createAccountService>;
