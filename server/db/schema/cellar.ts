import { index, integer, jsonb, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { usersTable } from './auth';
import { double, tenantColumns } from './columns';

export const tanksTable = pgTable(
  'tanks',
  {
    ...tenantColumns(),
    name: text('name').notNull(),
    capacityL: double('capacity_l').notNull(),
    notes: text('notes').notNull().default(''),
  },
  (t) => [uniqueIndex('tanks_winery_name_uq').on(t.wineryId, t.name)],
);

export const lotStyles = ['white', 'rosé', 'red', 'sweet', 'sparkling'] as const;

export const lotsTable = pgTable(
  'lots',
  {
    ...tenantColumns(),
    code: text('code').notNull(),
    name: text('name').notNull(),
    style: text('style', { enum: lotStyles }).notNull(),
    vintage: integer('vintage'),
    volumeL: double('volume_l').notNull(),
    tankId: uuid('tank_id').references(() => tanksTable.id, { onDelete: 'set null' }),
    ethanolPctVol: double('ethanol_pct_vol').notNull(),
    sugarGPerL: double('sugar_g_per_l').notNull().default(0),
    tempC: double('temp_c').notNull(),
    notes: text('notes').notNull().default(''),
    archivedAt: timestamp('archived_at', { withTimezone: true }),
  },
  (t) => [uniqueIndex('lots_winery_code_uq').on(t.wineryId, t.code), index('lots_winery_tank_idx').on(t.wineryId, t.tankId)],
);

export type DiscPoint = { timeS: number; volumeMl: number };

export const labResultsTable = pgTable(
  'lab_results',
  {
    ...tenantColumns(),
    lotId: uuid('lot_id')
      .notNull()
      .references(() => lotsTable.id, { onDelete: 'restrict' }),
    sampledAt: timestamp('sampled_at', { withTimezone: true }).notNull(),
    turbidityNtu: double('turbidity_ntu'),
    t200s: double('t200_s'),
    t400s: double('t400_s'),
    discDiameterMm: double('disc_diameter_mm'),
    discPressureBar: double('disc_pressure_bar'),
    discPoints: jsonb('disc_points').$type<DiscPoint[]>(),
    freeSo2MgL: double('free_so2_mg_l'),
    notes: text('notes').notNull().default(''),
    createdBy: text('created_by').references(() => usersTable.id, { onDelete: 'set null' }),
    createdByName: text('created_by_name'),
  },
  (t) => [index('lab_results_lot_idx').on(t.lotId, t.sampledAt)],
);
