import type { DbOrTx } from '../client';

/** Demo data for the equipment of a winery (idempotent: does nothing when the winery already has some). */
export async function seedEquipment(_tx: DbOrTx, _ctx: { wineryId: string; actorId: string }) {}
