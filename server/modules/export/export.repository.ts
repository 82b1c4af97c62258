import { and, asc, eq, getTableColumns, gt, type SQL } from 'drizzle-orm';
import type { PgTable } from 'drizzle-orm/pg-core';
import type { DbOrTx } from '../../db/client';
import type { OwnedTable } from '../../db/list';
import {
  attachmentsTable,
  auditEventsTable,
  cartridgeEventsTable,
  cartridgesTable,
  cartridgeTypesTable,
  hosePresetsTable,
  housingsTable,
  labResultsTable,
  linesTable,
  loggerImportsTable,
  loggerProfilesTable,
  lotsTable,
  membershipsTable,
  planLotsTable,
  plansTable,
  planTrainsTable,
  runChangesTable,
  runReadingCorrectionsTable,
  runReadingsTable,
  runsTable,
  runStageCartridgesTable,
  tanksTable,
  usersTable,
  wineriesTable,
} from '../../db/schema';

/** One CSV of the export: a winery-owned table (every column), optionally narrowed. */
export type ExportTable = { file: string; table: OwnedTable; where?: SQL };

/**
 * The record tables of a winery, one CSV each. A table added later belongs here too (every
 * column of a table is written, so new columns need nothing), or in `notExported` with its
 * reason: a test holds every table with a winery_id column to one of the two.
 */
export const exportTables: ExportTable[] = [
  { file: 'tanks.csv', table: tanksTable },
  { file: 'lots.csv', table: lotsTable },
  { file: 'lab-results.csv', table: labResultsTable },
  { file: 'housings.csv', table: housingsTable },
  { file: 'lines.csv', table: linesTable },
  { file: 'cartridge-types.csv', table: cartridgeTypesTable },
  { file: 'cartridges.csv', table: cartridgesTable },
  { file: 'cartridge-events.csv', table: cartridgeEventsTable },
  { file: 'care-cycles.csv', table: cartridgeEventsTable, where: eq(cartridgeEventsTable.kind, 'cycle') },
  { file: 'integrity-tests.csv', table: cartridgeEventsTable, where: eq(cartridgeEventsTable.kind, 'integrity') },
  { file: 'plans.csv', table: plansTable },
  { file: 'plan-lots.csv', table: planLotsTable },
  { file: 'plan-trains.csv', table: planTrainsTable },
  { file: 'hose-presets.csv', table: hosePresetsTable },
  { file: 'runs.csv', table: runsTable },
  { file: 'run-cartridges.csv', table: runStageCartridgesTable },
  { file: 'run-changes.csv', table: runChangesTable },
  { file: 'readings.csv', table: runReadingsTable },
  { file: 'reading-corrections.csv', table: runReadingCorrectionsTable },
  { file: 'logger-imports.csv', table: loggerImportsTable },
  { file: 'logger-profiles.csv', table: loggerProfilesTable },
  { file: 'attachments.csv', table: attachmentsTable },
  { file: 'audit-events.csv', table: auditEventsTable },
];

/** Tables with a winery_id column that the export leaves out, and why. */
export const notExported: Record<string, string> = {
  memberships: 'written as members.csv (name, e-mail, role, since), without account secrets',
  invitations: 'pending invitations carry sign-up tokens',
  alerts: 'worked out again from the records by the alert rules',
  notifications: 'each person’s bell, worked out from the alerts',
  alert_preferences: 'each person’s mail settings, not records',
  mail_failures: 'the mail queue’s delivery failures, kept for resending',
  winery_changes: 'the data version’s bookkeeping',
  winery_change_counts: 'the data version’s bookkeeping',
};

/** The header of a table's CSV: its column names as stored. */
export function exportHeader(table: PgTable): string[] {
  return Object.values(getTableColumns(table)).map((c) => c.name);
}

export const EXPORT_PAGE_SIZE = 500;

export function createExportRepository(db: DbOrTx) {
  return {
    async winery(wineryId: string) {
      const [row] = await db.select({ id: wineriesTable.id, name: wineriesTable.name }).from(wineriesTable).where(eq(wineriesTable.id, wineryId));
      return row ?? null;
    },

    /** The rows of one table of the winery as arrays in header order, read in pages by id (keyset). */
    async *rows(spec: ExportTable, wineryId: string, pageSize = EXPORT_PAGE_SIZE): AsyncGenerator<unknown[]> {
      const columns = Object.entries(getTableColumns(spec.table));
      let after: string | null = null;
      for (;;) {
        const page: Record<string, unknown>[] = await db
          .select()
          .from(spec.table as PgTable)
          .where(and(eq(spec.table.wineryId, wineryId), spec.where, after ? gt(spec.table.id, after) : undefined))
          .orderBy(asc(spec.table.id))
          .limit(pageSize);
        for (const row of page) yield columns.map(([key]) => row[key]);
        if (page.length < pageSize) return;
        after = page[page.length - 1].id as string;
      }
    },

    /** The team: name, e-mail, role and since when (no passwords, no sessions). */
    async members(wineryId: string) {
      return db
        .select({ userId: usersTable.id, name: usersTable.name, email: usersTable.email, role: membershipsTable.role, joinedAt: membershipsTable.createdAt })
        .from(membershipsTable)
        .innerJoin(usersTable, eq(usersTable.id, membershipsTable.userId))
        .where(eq(membershipsTable.wineryId, wineryId))
        .orderBy(asc(usersTable.name));
    },

    /** Attachments' metadata in pages by id. */
    async *attachments(wineryId: string, pageSize = 100) {
      let after: string | null = null;
      for (;;) {
        const page = await db
          .select({ id: attachmentsTable.id, ownerKind: attachmentsTable.ownerKind, fileName: attachmentsTable.fileName, storageKey: attachmentsTable.storageKey })
          .from(attachmentsTable)
          .where(and(eq(attachmentsTable.wineryId, wineryId), after ? gt(attachmentsTable.id, after) : undefined))
          .orderBy(asc(attachmentsTable.id))
          .limit(pageSize);
        yield* page;
        if (page.length < pageSize) return;
        after = page[page.length - 1].id;
      }
    },
  };
}
