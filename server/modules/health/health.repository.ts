import { sql } from 'drizzle-orm';
import type { Database } from '../../db/client';

export function createHealthRepository(db: Database) {
  return {
    /** True when the database answers a trivial query. */
    async ping(): Promise<boolean> {
      return db.execute(sql`select 1`).then(
        () => true,
        () => false,
      );
    },
  };
}
