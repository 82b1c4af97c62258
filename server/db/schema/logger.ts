import { index, integer, jsonb, pgTable, text, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import type { LoggerMapping } from '../../../shared/schemas/logger';
import { usersTable } from './auth';
import { tenantColumns } from './columns';
import { runsTable } from './runs';

/** A winery's saved way of reading one logger's export (columns, units, time zone). */
export const loggerProfilesTable = pgTable(
  'logger_profiles',
  {
    ...tenantColumns(),
    name: text('name').notNull(),
    mapping: jsonb('mapping').$type<LoggerMapping>().notNull(),
    createdBy: text('created_by').references(() => usersTable.id, { onDelete: 'set null' }),
    createdByName: text('created_by_name'),
  },
  (t) => [uniqueIndex('logger_profiles_winery_name_uq').on(t.wineryId, t.name)],
);

/**
 * One logger file imported into a run's stage: its SHA-256 (the same file on the same stage
 * is imported once), what was read and stored, and the original kept as an attachment.
 */
export const loggerImportsTable = pgTable(
  'logger_imports',
  {
    ...tenantColumns(),
    runId: uuid('run_id')
      .notNull()
      .references(() => runsTable.id, { onDelete: 'restrict' }),
    stageIndex: integer('stage_index').notNull(),
    fileSha256: text('file_sha256').notNull(),
    fileName: text('file_name').notNull(),
    rowCount: integer('row_count').notNull(),
    importedCount: integer('imported_count').notNull(),
    attachmentId: uuid('attachment_id'),
    profileId: uuid('profile_id'),
    mapping: jsonb('mapping').$type<LoggerMapping>().notNull(),
    createdBy: text('created_by').references(() => usersTable.id, { onDelete: 'set null' }),
    createdByName: text('created_by_name'),
  },
  (t) => [uniqueIndex('logger_imports_run_stage_file_uq').on(t.runId, t.stageIndex, t.fileSha256), index('logger_imports_winery_idx').on(t.wineryId)],
);
