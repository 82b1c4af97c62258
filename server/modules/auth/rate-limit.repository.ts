import { and, eq, gt, lt, sql } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { rateLimitHitsTable } from '../../db/schema';

export type RateLimitHits = { hits: number; resetAt: Date };

/**
 * Rate-limit counters in PostgreSQL, so every server instance counts the same hits. A key's
 * window starts at its first hit and lasts `windowMs`; a hit after the window starts a new one.
 */
export function createRateLimitRepository(db: DbOrTx) {
  return {
    /** Counts one hit in one statement (no read-then-write race between instances). */
    async increment(key: string, windowMs: number): Promise<RateLimitHits> {
      const t = rateLimitHitsTable;
      const fresh = sql`${t.resetAt} <= now()`;
      const [row] = await db
        .insert(t)
        .values({ key, hits: 1, resetAt: sql`now() + ${windowMs}::double precision * interval '1 millisecond'` })
        .onConflictDoUpdate({
          target: t.key,
          set: {
            hits: sql`case when ${fresh} then 1 else ${t.hits} + 1 end`,
            resetAt: sql`case when ${fresh} then excluded.reset_at else ${t.resetAt} end`,
          },
        })
        .returning({ hits: t.hits, resetAt: t.resetAt });
      return row;
    },

    /** The hits of the key's current window; null when it has none. */
    async get(key: string): Promise<RateLimitHits | null> {
      const [row] = await db
        .select({ hits: rateLimitHitsTable.hits, resetAt: rateLimitHitsTable.resetAt })
        .from(rateLimitHitsTable)
        .where(and(eq(rateLimitHitsTable.key, key), gt(rateLimitHitsTable.resetAt, sql`now()`)));
      return row ?? null;
    },

    async decrement(key: string) {
      await db
        .update(rateLimitHitsTable)
        .set({ hits: sql`greatest(${rateLimitHitsTable.hits} - 1, 0)` })
        .where(and(eq(rateLimitHitsTable.key, key), gt(rateLimitHitsTable.resetAt, sql`now()`)));
    },

    async reset(key: string) {
      await db.delete(rateLimitHitsTable).where(eq(rateLimitHitsTable.key, key));
    },

    /** Removes windows that ended (housekeeping; an ended window counts nothing anyway). */
    async removeEnded() {
      await db.delete(rateLimitHitsTable).where(lt(rateLimitHitsTable.resetAt, sql`now()`));
    },
  };
}

export type RateLimitRepository = ReturnType<typeof createRateLimitRepository>;
