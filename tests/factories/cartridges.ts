// Rows the cartridge tests stand on, inserted straight into the test database.
import { randomUUID } from 'node:crypto';
import type { Database } from '../../server/db/client';
import { cartridgeTypesTable, housingsTable } from '../../server/db/schema';

let n = 0;
const unique = (prefix: string) => {
  n += 1;
  return `${prefix} ${Date.now().toString(36)}-${n}`;
};

export async function insertHousing(db: Database, wineryId: string, values: Partial<typeof housingsTable.$inferInsert> = {}) {
  const [row] = await db
    .insert(housingsTable)
    .values({ id: randomUUID(), wineryId, name: unique('Housing'), rounds: 3, lengthIn: 30, maxPressureBar: 6, maxTempC: 135, holdUpL: 12, ...values })
    .returning();
  return row;
}

export async function insertCartridgeType(db: Database, wineryId: string, values: Partial<typeof cartridgeTypesTable.$inferInsert> = {}) {
  const [row] = await db
    .insert(cartridgeTypesTable)
    .values({
      id: randomUUID(),
      wineryId,
      name: unique('Type'),
      kind: 'membrane',
      media: 'PES',
      ratingUm: 0.45,
      areaM2Per10in: 0.7,
      waterFlowLhPer10in: 1500,
      waterDpBar: 0.1,
      maxDpForwardBar: 5,
      maxDpReverseBar: null,
      maxTempC: 85,
      terminalDpBar: 1.5,
      designFluxLhPer10in: 800,
      ratedSteamCycles: 50,
      ratedHotWaterCycles: 100,
      ratedChemicalCycles: 20,
      flowRecoveryMinPct: 60,
      ...values,
    })
    .returning();
  return row;
}

/** A delivery file from rows of [serial, batch, type, length, received]. */
export function deliveryCsv(rows: (string | number)[][], header = 'serial,batch,type,length,received') {
  return [header, ...rows.map((r) => r.join(','))].join('\n') + '\n';
}

/** A unique serial prefix per test run. */
export const serialPrefix = () => `T${Date.now().toString(36).toUpperCase()}${Math.floor(Math.random() * 1e4)}`;
