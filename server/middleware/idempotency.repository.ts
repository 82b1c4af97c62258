import { and, eq } from 'drizzle-orm';
import type { DbOrTx } from '../db/client';
import { idempotencyKeysTable } from '../db/schema';

export type IdempotencyKeyRow = typeof idempotencyKeysTable.$inferSelect;

/** The stored answers to writes sent with an Idempotency-Key, one row per person and key. */
export function createIdempotencyRepository(db: DbOrTx) {
  const byKey = (userId: string, key: string) => and(eq(idempotencyKeysTable.userId, userId), eq(idempotencyKeysTable.key, key));
  return {
    /** Claims the key with `status` (pending); false when someone already holds it. */
    async claim(userId: string, key: string, route: string, status: number): Promise<boolean> {
      const claimed = await db
        .insert(idempotencyKeysTable)
        .values({ userId, key, route, status, body: null })
        .onConflictDoNothing()
        .returning({ key: idempotencyKeysTable.key });
      return claimed.length > 0;
    },
    async find(userId: string, key: string): Promise<IdempotencyKeyRow | undefined> {
      const [row] = await db.select().from(idempotencyKeysTable).where(byKey(userId, key));
      return row;
    },
    async storeAnswer(userId: string, key: string, status: number, body: object): Promise<void> {
      await db.update(idempotencyKeysTable).set({ status, body }).where(byKey(userId, key));
    },
    async release(userId: string, key: string): Promise<void> {
      await db.delete(idempotencyKeysTable).where(byKey(userId, key));
    },
  };
}
export type IdempotencyRepository = ReturnType<typeof createIdempotencyRepository>;
