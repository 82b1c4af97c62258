import { index, integer, json, jsonb, pgTable, text, timestamp, uniqueIndex, uuid, type AnyPgColumn } from 'drizzle-orm/pg-core';
import { sql } from 'drizzle-orm';
import type { RunReadinessAtStart } from '../../../shared/types/records';
import { usersTable } from './auth';
import { double, tenantColumns } from './columns';
import { cartridgesTable } from './cartridges';
import { cartridgeTypesTable, housingsTable } from './equipment';
import { planLotsTable, plansTable } from './plans';

export const runStatuses = ['running', 'closed'] as const;

/** A filtration run of one planned lot through its chosen train, followed by pressure readings. */
export const runsTable = pgTable(
  'runs',
  {
    ...tenantColumns(),
    planId: uuid('plan_id')
      .notNull()
      .references(() => plansTable.id, { onDelete: 'restrict' }),
    planLotId: uuid('plan_lot_id')
      .notNull()
      .references(() => planLotsTable.id, { onDelete: 'restrict' }),
    status: text('status', { enum: runStatuses }).notNull().default('running'),
    startedAt: timestamp('started_at', { withTimezone: true }).notNull().defaultNow(),
    closedAt: timestamp('closed_at', { withTimezone: true }),
    startedBy: text('started_by').references(() => usersTable.id, { onDelete: 'set null' }),
    closedBy: text('closed_by').references(() => usersTable.id, { onDelete: 'set null' }),
    /** Closing notes. */
    notes: text('notes').notNull().default(''),
    // Names as they were at the time, so removing a member never blanks "who".
    startedByName: text('started_by_name'),
    closedByName: text('closed_by_name'),
    /** Why a cellar master or owner started despite the start checks; null when nothing was overridden. */
    overrideReason: text('override_reason'),
    overrideByName: text('override_by_name'),
    /** The overridden checks, as `{ stageIndex, code, message }`. */
    overriddenChecks: jsonb('overridden_checks').$type<{ stageIndex: number; code: string; message: string }[]>(),
    /** Readings that count (not voided), kept in the same statement or transaction as every reading write. */
    readingCount: integer('reading_count').notNull().default(0),
    /** Litres through the train: the highest counted reading's (corrected) volume, 0 before any; kept like readingCount. */
    currentVolumeL: double('current_volume_l').notNull().default(0),
    /** The lot's readiness as judged when the run started (verdict, reasons, thresholds, analyses); null for runs started before it was kept. */
    readinessAtStart: jsonb('readiness_at_start').$type<RunReadinessAtStart>(),
  },
  (t) => [index('runs_winery_started_idx').on(t.wineryId, t.startedAt), index('runs_plan_lot_idx').on(t.planLotId, t.status)],
);

/** One pressure reading of one stage during a run; volumeL is cumulative litres through the train. */
export const runReadingsTable = pgTable(
  'run_readings',
  {
    ...tenantColumns(),
    runId: uuid('run_id')
      .notNull()
      .references(() => runsTable.id, { onDelete: 'restrict' }),
    stageIndex: integer('stage_index').notNull(),
    at: timestamp('at', { withTimezone: true }).notNull().defaultNow(),
    volumeL: double('volume_l').notNull(),
    upstreamBar: double('upstream_bar').notNull(),
    downstreamBar: double('downstream_bar').notNull(),
    flowLh: double('flow_lh'),
    tempC: double('temp_c'),
    /** The client's own id for the reading, so a resent reading is stored once. */
    clientKey: text('client_key').notNull(),
    createdBy: text('created_by').references(() => usersTable.id, { onDelete: 'set null' }),
    createdByName: text('created_by_name'),
  },
  (t) => [
    uniqueIndex('run_readings_run_client_key_uq').on(t.runId, t.clientKey),
    index('run_readings_run_stage_idx').on(t.runId, t.stageIndex, t.volumeL),
    // The few readings whose "who" is the user's current name (no name kept on the row): a
    // rename makes their runs' stored figures stale (trigger, migration 0023).
    index('run_readings_unnamed_by_idx').on(t.createdBy).where(sql`${t.createdByName} is null`),
  ],
);

export const runChangeKinds = ['change', 'regeneration'] as const;

/** A cartridge change or an in-place regeneration on one stage during a run, at litres through the train. */
export const runChangesTable = pgTable(
  'run_changes',
  {
    ...tenantColumns(),
    runId: uuid('run_id')
      .notNull()
      .references(() => runsTable.id, { onDelete: 'restrict' }),
    stageIndex: integer('stage_index').notNull(),
    kind: text('kind', { enum: runChangeKinds }).notNull(),
    atVolumeL: double('at_volume_l').notNull(),
    removedCartridgeIds: jsonb('removed_cartridge_ids').$type<string[]>().notNull().default([]),
    installedCartridgeIds: jsonb('installed_cartridge_ids').$type<string[]>().notNull().default([]),
    createdBy: text('created_by').references(() => usersTable.id, { onDelete: 'set null' }),
    createdByName: text('created_by_name'),
  },
  (t) => [index('run_changes_run_idx').on(t.runId, t.atVolumeL)],
);

/**
 * What was physically in each stage of a run: one row per cartridge per stint. Rows of the
 * cartridges in at start have installed_at_volume_l 0; a change closes rows (removed_at_volume_l)
 * and opens new ones. litres_carried is set at close.
 */
export const runStageCartridgesTable = pgTable(
  'run_stage_cartridges',
  {
    ...tenantColumns(),
    runId: uuid('run_id')
      .notNull()
      .references(() => runsTable.id, { onDelete: 'restrict' }),
    stageIndex: integer('stage_index').notNull(),
    housingId: uuid('housing_id')
      .notNull()
      .references(() => housingsTable.id, { onDelete: 'restrict' }),
    housingName: text('housing_name').notNull(),
    cartridgeId: uuid('cartridge_id')
      .notNull()
      .references(() => cartridgesTable.id, { onDelete: 'restrict' }),
    serial: text('serial').notNull(),
    batch: text('batch'),
    typeId: uuid('type_id')
      .notNull()
      .references(() => cartridgeTypesTable.id, { onDelete: 'restrict' }),
    typeName: text('type_name').notNull(),
    ratingUm: double('rating_um').notNull(),
    lengthIn: double('length_in'),
    litresAtStart: double('litres_at_start').notNull(),
    cyclesAtStart: integer('cycles_at_start').notNull(),
    installedAtVolumeL: double('installed_at_volume_l').notNull().default(0),
    removedAtVolumeL: double('removed_at_volume_l'),
    litresCarried: double('litres_carried'),
    changeId: uuid('change_id').references((): AnyPgColumn => runChangesTable.id, { onDelete: 'restrict' }),
  },
  (t) => [index('run_stage_cartridges_run_idx').on(t.runId, t.stageIndex), index('run_stage_cartridges_cartridge_idx').on(t.cartridgeId)],
);

export const readingCorrectionKinds = ['correct', 'void'] as const;

/** A correction or a void of a reading; the reading row itself is never changed. The latest wins. */
export const runReadingCorrectionsTable = pgTable(
  'run_reading_corrections',
  {
    ...tenantColumns(),
    runId: uuid('run_id')
      .notNull()
      .references(() => runsTable.id, { onDelete: 'restrict' }),
    readingId: uuid('reading_id')
      .notNull()
      .references(() => runReadingsTable.id, { onDelete: 'restrict' }),
    kind: text('kind', { enum: readingCorrectionKinds }).notNull(),
    volumeL: double('volume_l'),
    upstreamBar: double('upstream_bar'),
    downstreamBar: double('downstream_bar'),
    flowLh: double('flow_lh'),
    tempC: double('temp_c'),
    reason: text('reason').notNull(),
    createdBy: text('created_by').references(() => usersTable.id, { onDelete: 'set null' }),
    createdByName: text('created_by_name'),
  },
  (t) => [index('run_reading_corrections_reading_idx').on(t.readingId, t.createdAt), index('run_reading_corrections_run_idx').on(t.runId)],
);

/**
 * The run's figures that depend on its readings, kept so the run page and Today do not read and
 * fit every reading on each request. `version` goes up (by triggers, migration 0023) in the same
 * statement as any write of the run's readings, corrections or changes (and a rename of a user
 * whose readings carry no name of their own). Each entry is stored with the version it was
 * worked out at and a key: the small inputs it was worked out with (status, litres, terminal ΔP
 * per stage, line flow, gauge resolution…), read again on every request; an entry is used only
 * when both still match. `page`: the run page's per-stage figures (thinned chart readings, fit,
 * curve, forecast, alarm, final figures); `today`: Today's per-stage figures of a run in
 * progress. Kept as `json` (the text as written: same keys in the same order). A cache:
 * nothing is lost if a row goes, it is worked out again.
 */
export const runFiguresTable = pgTable('run_figures', {
  runId: uuid('run_id')
    .primaryKey()
    .references(() => runsTable.id, { onDelete: 'cascade' }),
  version: integer('version').notNull().default(0),
  pageVersion: integer('page_version'),
  pageKey: text('page_key'),
  page: json('page'),
  todayVersion: integer('today_version'),
  todayKey: text('today_key'),
  today: json('today'),
});
