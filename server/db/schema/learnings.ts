import { integer, pgTable, primaryKey, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { double } from './columns';
import { runsTable } from './runs';

/**
 * What one stage of a closed run tells the capacity learning (engine `stageLitresPerM2FromRun`,
 * worked out per litre of the stage, i.e. for 1 m²: the plan divides by the stage's area), kept
 * so a plan page or Today does not read and fit every reading of sixty past runs on each visit.
 * `inputs` names what the figure was worked out from: the stage's cartridge type and its terminal
 * ΔP, and the version of the run's readings, corrections and changes (`run_figures.version`,
 * raised by triggers on every write of them, migration 0023 — the same version the run page's
 * stored figures use). A row whose `inputs` are not the current ones is worked out again. A
 * cache: nothing is lost if a row goes.
 */
export const runStageLearningsTable = pgTable(
  'run_stage_learnings',
  {
    runId: uuid('run_id')
      .notNull()
      .references(() => runsTable.id, { onDelete: 'cascade' }),
    stageIndex: integer('stage_index').notNull(),
    inputs: text('inputs').notNull(),
    /** Litres to terminal ΔP (median over the stage's sets); null when the stage told nothing. */
    litres: double('litres'),
    basis: text('basis', { enum: ['reached', 'fit'] }),
    sets: integer('sets'),
    computedAt: timestamp('computed_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.runId, t.stageIndex] })],
);
