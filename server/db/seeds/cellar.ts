import type { DbOrTx } from '../client';

/** Demo data for the cellar of a winery (idempotent: does nothing when the winery already has some). */
export async function seedCellar(_tx: DbOrTx, _ctx: { wineryId: string; actorId: string }) {}
