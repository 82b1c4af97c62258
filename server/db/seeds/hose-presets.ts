// Demo data: Quillwater Estate's usual hoses, saved as presets to pick from on a plan's trains.
// Invented figures; demo data.
import type { DbOrTx } from '../client';
import { hosePresetsTable } from '../schema';

const PRESETS = [
  { name: 'Tank to pump, 38 mm', diameterMm: 38, lengthM: 12, sumK: 2.5 },
  { name: 'Pump to filters, 38 mm', diameterMm: 38, lengthM: 6, sumK: 1.5 },
  { name: 'Filters to filler, 51 mm', diameterMm: 51, lengthM: 18, sumK: 3 },
] as const;

/** The winery's usual hoses (idempotent: a name already there is left as it is). */
export async function seedHosePresets(tx: DbOrTx, ctx: { wineryId: string; actorId: string }) {
  await tx
    .insert(hosePresetsTable)
    .values(PRESETS.map((p) => ({ wineryId: ctx.wineryId, ...p, roughnessMm: null, createdBy: ctx.actorId, createdByName: null })))
    .onConflictDoNothing({ target: [hosePresetsTable.wineryId, hosePresetsTable.name] });
}
