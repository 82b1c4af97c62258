import { index, integer, jsonb, pgTable, text, timestamp, uniqueIndex, uuid, date, type AnyPgColumn } from 'drizzle-orm/pg-core';
import { usersTable } from './auth';
import { lotsTable } from './cellar';
import { double, tenantColumns } from './columns';
import { linesTable } from './equipment';

export const planStatuses = ['draft', 'approved', 'done'] as const;
export const planSanitationKinds = ['hot-water', 'steam'] as const;

/** One stage of a stored train: catalogue ids, not copies, so the catalogue stays the one source. */
export type PlanTrainStage = {
  name?: string;
  cartridgeTypeId: string;
  housingId: string;
  housingCount: number;
  /** Expected litres per m² to terminal ΔP for this wine; absent when unknown. */
  capacityLPerM2?: number | null;
};
export type PlanTrainHose = { diameterMm: number; lengthM: number; roughnessMm?: number | null; sumK?: number | null };

/** A bottling day. */
export const plansTable = pgTable(
  'plans',
  {
    ...tenantColumns(),
    name: text('name').notNull(),
    plannedDate: date('planned_date', { mode: 'string' }).notNull(),
    // A deleted line leaves the plan without one (the plan asks for a line again) rather than blocking the delete.
    lineId: uuid('line_id').references(() => linesTable.id, { onDelete: 'set null' }),
    status: text('status', { enum: planStatuses }).notNull().default('draft'),
    /** HH:MM, the winery's local wall-clock time. */
    startTime: text('start_time').notNull().default('07:00'),
    sanitationKind: text('sanitation_kind', { enum: planSanitationKinds }).notNull().default('hot-water'),
    notes: text('notes').notNull().default(''),
    approvedBy: text('approved_by').references(() => usersTable.id, { onDelete: 'set null' }),
    approvedByName: text('approved_by_name'),
    approvedAt: timestamp('approved_at', { withTimezone: true }),
    /** Cautions the approver accepted (flux above design, a lot not ready, a stock shortfall) and their written reason. */
    approvalCautions: jsonb('approval_cautions').$type<string[]>(),
    approvalReason: text('approval_reason'),
    /** Each lot's chosen-train sizing as it stood at approval (by plan lot id), for the record. */
    approvedSizing: jsonb('approved_sizing').$type<Record<string, unknown>>(),
    createdBy: text('created_by').references(() => usersTable.id, { onDelete: 'set null' }),
    createdByName: text('created_by_name'),
    /** 1 for a new plan; a reopened plan whose lots were run continues as a new row with revision + 1. */
    revision: integer('revision').notNull().default(1),
    previousPlanId: uuid('previous_plan_id').references((): AnyPgColumn => plansTable.id, { onDelete: 'restrict' }),
    archivedAt: timestamp('archived_at', { withTimezone: true }),
  },
  (t) => [index('plans_winery_date_idx').on(t.wineryId, t.plannedDate), index('plans_winery_status_idx').on(t.wineryId, t.status)],
);

/** A lot bottled on the day, in order. */
export const planLotsTable = pgTable(
  'plan_lots',
  {
    ...tenantColumns(),
    planId: uuid('plan_id')
      .notNull()
      .references(() => plansTable.id, { onDelete: 'cascade' }),
    lotId: uuid('lot_id')
      .notNull()
      .references(() => lotsTable.id, { onDelete: 'restrict' }),
    position: integer('position').notNull(),
    volumeL: double('volume_l').notNull(),
    chosenTrainId: uuid('chosen_train_id').references((): AnyPgColumn => planTrainsTable.id, { onDelete: 'set null' }),
  },
  (t) => [uniqueIndex('plan_lots_plan_lot_uq').on(t.planId, t.lotId), index('plan_lots_plan_idx').on(t.planId, t.position)],
);

/** One train option for a planned lot; two or more are compared side by side. */
export const planTrainsTable = pgTable(
  'plan_trains',
  {
    ...tenantColumns(),
    planLotId: uuid('plan_lot_id')
      .notNull()
      .references(() => planLotsTable.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    stages: jsonb('stages').$type<PlanTrainStage[]>().notNull(),
    hoses: jsonb('hoses').$type<PlanTrainHose[]>(),
  },
  (t) => [index('plan_trains_plan_lot_idx').on(t.planLotId, t.createdAt)],
);

/** A winery's usual hose or line, saved to pick from when entering a train's hoses. */
export const hosePresetsTable = pgTable(
  'hose_presets',
  {
    ...tenantColumns(),
    name: text('name').notNull(),
    /** Inner diameter, mm. */
    diameterMm: double('diameter_mm').notNull(),
    /** Length, m. */
    lengthM: double('length_m').notNull(),
    /** Absolute roughness, mm; null for the engine's default. */
    roughnessMm: double('roughness_mm'),
    /** Sum of the fittings' loss coefficients K; null for none. */
    sumK: double('sum_k'),
    createdBy: text('created_by').references(() => usersTable.id, { onDelete: 'set null' }),
    createdByName: text('created_by_name'),
  },
  (t) => [uniqueIndex('hose_presets_winery_name_uq').on(t.wineryId, t.name)],
);
