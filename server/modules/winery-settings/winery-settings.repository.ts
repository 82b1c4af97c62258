import { eq } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { wineriesTable } from '../../db/schema';

export function createWinerySettingsRepository(db: DbOrTx) {
  return {
    async find(wineryId: string) {
      const [row] = await db.select().from(wineriesTable).where(eq(wineriesTable.id, wineryId));
      return row ?? null;
    },
    async update(wineryId: string, changes: { name?: string; settings?: Record<string, unknown> }) {
      await db.update(wineriesTable).set(changes).where(eq(wineriesTable.id, wineryId));
    },
  };
}
