import { generateIdFromEntropySize } from 'lucia';
import type { PasswordResetConfirmInput, SignInInput, SignUpInput } from '../../../shared/schemas/auth';
import type { Database, DbOrTx } from '../../db/client';
import type { Auth } from '../../lib/auth';
import { conflict, gone, HttpError } from '../../lib/errors';
import type { Mailer } from '../../lib/mail';
import { dummyPasswordHash, hashPassword, verifyPassword } from '../../lib/passwords';
import { createToken, hashToken } from '../../lib/tokens';
import { createAuthRepository } from './auth.repository';

export const RESET_TOKEN_MINUTES = 60;
export const SIGN_UP_TOKEN_HOURS = 24;

type Deps = { db: Database; auth: Auth; mailer: Mailer; appUrl: string };

/**
 * People's accounts as other modules may use them (team invitations), on `db` or inside the
 * caller's transaction: they go through here, never through the auth repository.
 */
export function accountsIn(db: DbOrTx) {
  const repo = createAuthRepository(db);
  return {
    findByEmail: (email: string) => repo.findUserByEmail(email),
    /** Creates the account; null when the address is already taken. */
    create: (user: { id: string; email: string; name: string; passwordHash: string; activeWineryId?: string | null }) => repo.insertUser(user),
    setActiveWinery: (userId: string, wineryId: string | null) => repo.setActiveWinery(userId, wineryId),
  };
}

export function createAuthService({ db, auth, mailer, appUrl }: Deps) {
  const repo = createAuthRepository(db);

  return {
    /**
     * Answers the same for a new and a taken address: a new address gets a link that creates the
     * account; the owner of a taken address gets a note that someone tried (nothing is created).
     */
    async requestSignUp(input: SignUpInput, now = new Date()) {
      const existing = await repo.findUserByEmail(input.email);
      if (existing) {
        await mailer.send({
          to: existing.email,
          subject: 'Someone tried to create a Porewise account with your address',
          text:
            `Hello ${existing.name},\n\nSomeone (perhaps you) tried to create a new Porewise account with this e-mail address, ` +
            `which already has one. Nothing was changed.\n\nSign in: ${appUrl}/sign-in\nForgot your password? ${appUrl}/forgot-password\n\n` +
            `If it was not you, you can ignore this message.\n`,
        });
        return;
      }
      const token = createToken();
      await repo.insertSignUpRequest({
        tokenHash: await hashToken(token),
        email: input.email,
        name: input.name,
        wineryName: input.wineryName,
        passwordHash: await hashPassword(input.password),
        expiresAt: new Date(now.getTime() + SIGN_UP_TOKEN_HOURS * 3_600_000),
      });
      const link = `${appUrl}/confirm-sign-up?token=${encodeURIComponent(token)}`;
      await mailer.send({
        to: input.email,
        subject: 'Confirm your Porewise account',
        text:
          `Hello ${input.name},\n\nOpen this link within ${SIGN_UP_TOKEN_HOURS} hours to finish creating your Porewise account ` +
          `for ${input.wineryName}:\n\n${link}\n\nIf you did not ask for this, ignore this message; no account is created.\n`,
      });
    },

    /** Creates the person, their winery and their owner membership in one transaction; opens a session. */
    async confirmSignUp(input: { token: string }, now = new Date()) {
      const tokenHash = await hashToken(input.token);
      const userId = generateIdFromEntropySize(10);
      await db.transaction(async (tx) => {
        const txRepo = createAuthRepository(tx);
        const request = await txRepo.consumeSignUpRequest(tokenHash, now);
        if (!request) throw gone('This sign-up link has expired or was already used. Sign up again.');
        if (await txRepo.findUserByEmail(request.email)) {
          throw conflict('An account with this e-mail already exists. Sign in instead.', 'email_taken');
        }
        const winery = await txRepo.insertWinery(request.wineryName);
        const user = await txRepo.insertUser({ id: userId, email: request.email, name: request.name, passwordHash: request.passwordHash, activeWineryId: winery.id });
        if (!user) throw conflict('An account with this e-mail already exists. Sign in instead.', 'email_taken');
        await txRepo.insertMembership({ wineryId: winery.id, userId, role: 'owner' });
      });
      return auth.createSession(userId, {});
    },

    /** Same answer for an unknown e-mail and a wrong password. */
    async signIn(input: SignInInput) {
      const user = await repo.findUserByEmail(input.email);
      const valid = user
        ? await verifyPassword(user.passwordHash, input.password)
        : (await verifyPassword(await dummyPasswordHash(), input.password), false);
      if (!user || !valid) throw new HttpError(401, 'bad_credentials', 'The e-mail or password is not right.');
      return auth.createSession(user.id, {});
    },

    /** Always succeeds from the caller's view; mails a link only when the account exists. */
    async requestPasswordReset(email: string, now = new Date()) {
      const user = await repo.findUserByEmail(email);
      const token = createToken();
      const tokenHash = await hashToken(token);
      if (!user) {
        // As much work as for a real account (a hash and a transaction), so the answer's timing tells nothing.
        await db.transaction(async (tx) => createAuthRepository(tx).findUserByEmail(email));
        return;
      }
      const link = `${appUrl}/reset-password?token=${encodeURIComponent(token)}`;
      // The reset and its mail job commit together: a crash after this loses neither.
      await db.transaction(async (tx) => {
        await createAuthRepository(tx).insertPasswordReset({
          tokenHash,
          userId: user.id,
          expiresAt: new Date(now.getTime() + RESET_TOKEN_MINUTES * 60_000),
        });
        await mailer.send(
          {
            to: user.email,
            subject: 'Reset your Porewise password',
            text:
              `Hello ${user.name},\n\nSomeone (hopefully you) asked to reset the password of your Porewise account.\n` +
              `Open this link within ${RESET_TOKEN_MINUTES} minutes to choose a new one:\n\n${link}\n\n` +
              `If you did not ask for this, ignore this message; your password stays as it is.\n`,
          },
          { db: tx, wineryId: user.activeWineryId ?? null },
        );
      });
    },

    /** Single use; ends every session of the person, then opens a fresh one. */
    async confirmPasswordReset(input: PasswordResetConfirmInput, now = new Date()) {
      const passwordHash = await hashPassword(input.password);
      const tokenHash = await hashToken(input.token);
      const userId = await db.transaction(async (tx) => {
        const txRepo = createAuthRepository(tx);
        const reset = await txRepo.consumePasswordReset(tokenHash, now);
        if (!reset) throw gone('This reset link has expired or was already used. Ask for a new one.');
        await txRepo.setPassword(reset.userId, passwordHash);
        await txRepo.revokeOpenPasswordResets(reset.userId, now);
        return reset.userId;
      });
      await auth.invalidateUserSessions(userId);
      return auth.createSession(userId, {});
    },
  };
}

export type AuthService = ReturnType<typeof createAuthService>;
