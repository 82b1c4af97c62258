import { date, index, integer, jsonb, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { usersTable } from './auth';
import { double, tenantColumns } from './columns';
import { cartridgeTypesTable, housingsTable } from './equipment';
import { wineriesTable } from './wineries';

export const cartridgeStatuses = ['in-stock', 'installed', 'regenerating', 'retired'] as const;

export const cartridgesTable = pgTable(
  'cartridges',
  {
    ...tenantColumns(),
    serial: text('serial').notNull(),
    batch: text('batch').notNull().default(''),
    typeId: uuid('type_id')
      .notNull()
      .references(() => cartridgeTypesTable.id, { onDelete: 'restrict' }),
    lengthIn: integer('length_in').notNull(),
    status: text('status', { enum: cartridgeStatuses }).notNull().default('in-stock'),
    housingId: uuid('housing_id').references(() => housingsTable.id, { onDelete: 'set null' }),
    position: integer('position'),
    receivedAt: date('received_at', { mode: 'string' }),
    // Derived from the history (kept in step by the service in the same transaction).
    litresFiltered: double('litres_filtered').notNull().default(0),
    steamCycles: integer('steam_cycles').notNull().default(0),
    hotWaterCycles: integer('hot_water_cycles').notNull().default(0),
    chemicalCycles: integer('chemical_cycles').notNull().default(0),
    retiredReason: text('retired_reason'),
    notes: text('notes').notNull().default(''),
    /** Hidden from lists when set; still in every record. */
    archivedAt: timestamp('archived_at', { withTimezone: true }),
  },
  (t) => [
    uniqueIndex('cartridges_winery_serial_uq').on(t.wineryId, t.serial),
    index('cartridges_winery_status_idx').on(t.wineryId, t.status),
    index('cartridges_winery_type_idx').on(t.wineryId, t.typeId),
    index('cartridges_winery_housing_idx').on(t.wineryId, t.housingId),
    index('cartridges_winery_batch_idx').on(t.wineryId, t.batch),
    // The inventory sorted by received date, page by page.
    index('cartridges_winery_received_idx').on(t.wineryId, t.receivedAt, t.id),
    // Search by part of a serial or batch (ILIKE '%…%'), for the page and its count (pg_trgm).
    index('cartridges_serial_trgm_idx').using('gin', t.serial.op('gin_trgm_ops')),
    index('cartridges_batch_trgm_idx').using('gin', t.batch.op('gin_trgm_ops')),
  ],
);

export const cartridgeEventKinds = ['registered', 'installed', 'removed', 'retired', 'run', 'cycle', 'integrity', 'note', 'run-correction'] as const;

/** Every move and every piece of care, with who and when. */
export const cartridgeEventsTable = pgTable(
  'cartridge_events',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    wineryId: uuid('winery_id')
      .notNull()
      .references(() => wineriesTable.id, { onDelete: 'cascade' }),
    cartridgeId: uuid('cartridge_id')
      .notNull()
      .references(() => cartridgesTable.id, { onDelete: 'restrict' }),
    kind: text('kind', { enum: cartridgeEventKinds }).notNull(),
    housingId: uuid('housing_id').references(() => housingsTable.id, { onDelete: 'restrict' }),
    position: integer('position'),
    details: jsonb('details').$type<Record<string, unknown>>().notNull().default({}),
    actorId: text('actor_id').references(() => usersTable.id, { onDelete: 'set null' }),
    /** The person's name at the time. */
    actorName: text('actor_name'),
    at: timestamp('at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('cartridge_events_cartridge_idx').on(t.cartridgeId, t.at),
    // Which cartridges have had a given kind of event (Today's life check).
    index('cartridge_events_cartridge_kind_idx').on(t.cartridgeId, t.kind),
  ],
);

/**
 * Today's life check of each cartridge, kept so Today forecasts only what changed. `version`
 * goes up (by triggers, migration 0017) whenever something the forecast reads changes: an
 * event of the cartridge written, changed or removed; its litres, length or type; its type's
 * ratings. Today recomputes a cartridge whose `checked_version` is not `version` and stores the
 * lead finding (`rank`, `closeness`, `attention`; null when nothing needs a look). A cache:
 * nothing is lost if a row goes, it is worked out again.
 */
export const cartridgeLifeFlagsTable = pgTable('cartridge_life_flags', {
  cartridgeId: uuid('cartridge_id')
    .primaryKey()
    .references(() => cartridgesTable.id, { onDelete: 'cascade' }),
  version: integer('version').notNull().default(1),
  checkedVersion: integer('checked_version'),
  rank: integer('rank'),
  closeness: double('closeness'),
  /** The lead reason, its figure and the other findings in words, as Today shows them. */
  attention: jsonb('attention').$type<{ reason: string; figure: unknown; alsoNoted: string[] }>(),
});

/** The columns of a cartridge the life forecast and Today's list read (one select shape for both). */
export const lifeCartridgeColumns = {
  id: cartridgesTable.id,
  serial: cartridgesTable.serial,
  status: cartridgesTable.status,
  typeId: cartridgesTable.typeId,
  housingId: cartridgesTable.housingId,
  position: cartridgesTable.position,
  litresFiltered: cartridgesTable.litresFiltered,
  lengthIn: cartridgesTable.lengthIn,
};
