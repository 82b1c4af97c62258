import { index, integer, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { usersTable } from './auth';
import { double, tenantColumns } from './columns';
import { planLotsTable, plansTable } from './plans';

export const runStatuses = ['running', 'closed'] as const;

/** A filtration run of one planned lot through its chosen train, followed by pressure readings. */
export const runsTable = pgTable(
  'runs',
  {
    ...tenantColumns(),
    planId: uuid('plan_id')
      .notNull()
      .references(() => plansTable.id, { onDelete: 'cascade' }),
    planLotId: uuid('plan_lot_id')
      .notNull()
      .references(() => planLotsTable.id, { onDelete: 'cascade' }),
    status: text('status', { enum: runStatuses }).notNull().default('running'),
    startedAt: timestamp('started_at', { withTimezone: true }).notNull().defaultNow(),
    closedAt: timestamp('closed_at', { withTimezone: true }),
    startedBy: text('started_by').references(() => usersTable.id, { onDelete: 'set null' }),
    closedBy: text('closed_by').references(() => usersTable.id, { onDelete: 'set null' }),
    notes: text('notes').notNull().default(''),
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
      .references(() => runsTable.id, { onDelete: 'cascade' }),
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
  },
  (t) => [uniqueIndex('run_readings_run_client_key_uq').on(t.runId, t.clientKey), index('run_readings_run_stage_idx').on(t.runId, t.stageIndex, t.volumeL)],
);
