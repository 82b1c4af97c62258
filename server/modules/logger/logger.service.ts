import { createHash, randomUUID } from 'node:crypto';
import Papa from 'papaparse';
import { createLoggerReader, detectDayFirst, LoggerFileError, thinPoints, type LoggerRow } from '../../../shared/logger/logger-file';
import { LOGGER_MAX_ROWS, LOGGER_PROFILES_MAX, type LoggerImportFields, type LoggerMapping, type LoggerProfileInput, type LoggerProfilePatch } from '../../../shared/schemas/logger';
import type { LoggerImportResultDto, LoggerPreviewDto, LoggerProfileDto, LoggerRowDto } from '../../../shared/types/logger';
import type { Database } from '../../db/client';
import { badRequest, conflict, HttpError, notFound } from '../../lib/errors';
import type { Storage } from '../../lib/storage';
import type { TenantContext } from '../../middleware/authorize';
import { insertAttachmentIn } from '../attachments/attachments.service';
import { safeFileName } from '../attachments/file-type';
import { recordChange } from '../audit/audit.service';
import { runForBulkReadings, runIsWinerys, storeReadings } from '../runs/runs.service';
import { createLoggerRepository, type LoggerProfileRow } from './logger.repository';

/** Rows shown in a preview, and errors listed. */
export const PREVIEW_ROWS = 50;
export const PREVIEW_ERRORS = 200;
export const CHART_POINTS = 400;
/** Row errors named as fields in a refused import. */
const ERROR_FIELDS = 20;

function presentProfile(row: LoggerProfileRow): LoggerProfileDto {
  return {
    id: row.id,
    name: row.name,
    mapping: row.mapping,
    createdByName: row.createdByName,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

function presentRow(r: LoggerRow): LoggerRowDto {
  return { row: r.row, at: new Date(r.at).toISOString(), volumeL: r.volumeL, upstreamBar: r.upstreamBar, downstreamBar: r.downstreamBar, dpBar: r.dpBar, flowLh: r.flowLh, tempC: r.tempC };
}

/** The file's text: UTF-8 (with or without a byte-order mark), else Windows-1252 as older loggers write. */
export function decodeLoggerFile(buf: Uint8Array): string {
  if (buf.length === 0) throw new LoggerFileError('The file is empty.', { file: 'The file is empty.' });
  if (buf.subarray(0, 64 * 1024).includes(0)) {
    throw new LoggerFileError('This is not a text file. Export the logger’s data as CSV or TSV and try again.', { file: 'Not a CSV or TSV text file.' });
  }
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(buf).replace(/^\uFEFF/, '');
  } catch {
    return new TextDecoder('windows-1252').decode(buf);
  }
}

/**
 * Reads a whole logger file with a mapping: papaparse streams it row by row into the reader,
 * so no array of raw rows is built. Day-first or month-first dates are decided from
 * the first few hundred rows.
 */
export function readLoggerFile(text: string, mapping: LoggerMapping, opts: { maxRows?: number; keepRows?: boolean } = {}) {
  const sample = Papa.parse<string[]>(text, { delimiter: mapping.delimiter ?? '', preview: 300 }).data;
  const reader = createLoggerReader(mapping, { dayFirst: detectDayFirst(sample.flat()), maxRows: opts.maxRows ?? LOGGER_MAX_ROWS, keepRows: opts.keepRows });
  let line = 0;
  let failure: unknown = null;
  Papa.parse<string[]>(text, {
    delimiter: mapping.delimiter ?? '',
    skipEmptyLines: false,
    // Streaming: each row goes to the reader as it is parsed; no array of all rows is built.
    step: (results, parser) => {
      try {
        reader.push(results.data, ++line);
      } catch (e) {
        failure = e;
        parser.abort();
      }
    },
  });
  if (failure) throw failure;
  return reader.finish();
}

const fileError = (e: unknown) => (e instanceof LoggerFileError ? badRequest(e.message, e.fields) : e);

/** Logger profiles of a winery, and logger files imported into a run's stage. */
export function createLoggerService({ db, storage }: { db: Database; storage: Storage }) {
  const repo = createLoggerRepository(db);

  async function mappingOf(wineryId: string, fields: LoggerImportFields): Promise<{ mapping: LoggerMapping; profileId: string | null }> {
    if (fields.mapping) return { mapping: fields.mapping, profileId: fields.profileId ?? null };
    const profile = await repo.profile(wineryId, fields.profileId!);
    if (!profile) throw notFound('Logger profile');
    return { mapping: profile.mapping, profileId: profile.id };
  }

  return {
    /** 404 unless the run is this winery's. */
    async requireRun(t: TenantContext, runId: string): Promise<void> {
      if (!(await runIsWinerys(db, t.wineryId, runId))) throw notFound('Run');
    },

    async listProfiles(t: TenantContext): Promise<{ items: LoggerProfileDto[] }> {
      return { items: (await repo.profiles(t.wineryId)).map(presentProfile) };
    },

    async createProfile(t: TenantContext, input: LoggerProfileInput): Promise<LoggerProfileDto> {
      if ((await repo.profileCount(t.wineryId)) >= LOGGER_PROFILES_MAX) {
        throw conflict(`A winery keeps at most ${String(LOGGER_PROFILES_MAX)} logger profiles; delete one you no longer use.`, 'too_many');
      }
      const row = await repo.insertProfile({ wineryId: t.wineryId, name: input.name, mapping: input.mapping, createdBy: t.userId, createdByName: t.userName ?? null });
      if (!row) throw new HttpError(409, 'name_taken', 'A logger profile of this name exists already.', { name: 'Choose another name: this one is taken.' });
      return presentProfile(row);
    },

    async updateProfile(t: TenantContext, id: string, patch: LoggerProfilePatch): Promise<LoggerProfileDto> {
      const row = await repo.updateProfile(t.wineryId, id, patch);
      if (row === undefined) throw notFound('Logger profile');
      if (row === null) throw new HttpError(409, 'name_taken', 'A logger profile of this name exists already.', { name: 'Choose another name: this one is taken.' });
      return presentProfile(row);
    },

    async removeProfile(t: TenantContext, id: string): Promise<void> {
      if (!(await repo.removeProfile(t.wineryId, id))) throw notFound('Logger profile');
    },

    /**
     * A logger file into a run's stage. A dry run reads it and answers the first rows, the
     * per-row errors and a ΔP-against-litres chart; otherwise every row must be right (or
     * nothing is stored), the rows go in through the runs' bulk insert in one transaction, and
     * the original is kept as an attachment of the run. The same file on the same stage is
     * imported once: its SHA-256 is claimed, and each row's key is the file's hash and its row.
     */
    async importFile(
      t: TenantContext,
      runId: string,
      file: { buffer: Uint8Array; originalName: string },
      fields: LoggerImportFields,
      opts: { dryRun: boolean },
    ): Promise<LoggerPreviewDto | LoggerImportResultDto> {
      const run = await runForBulkReadings(db, t.wineryId, runId);
      if (!run) throw notFound('Run');
      const { mapping, profileId } = await mappingOf(t.wineryId, fields);
      if (fields.stageIndex >= run.stageCount) throw badRequest('Check the highlighted fields.', { stageIndex: 'Choose a stage of this run’s train.' });
      const fingerprint = createHash('sha256').update(file.buffer).digest('hex');
      let read: ReturnType<typeof readLoggerFile>;
      try {
        read = readLoggerFile(decodeLoggerFile(file.buffer), mapping, { keepRows: true });
      } catch (e) {
        throw fileError(e);
      }
      const earlier = await repo.importOf(t.wineryId, runId, fields.stageIndex, fingerprint);

      if (opts.dryRun) {
        return {
          rows: read.rows.slice(0, PREVIEW_ROWS).map(presentRow),
          errors: read.errors.slice(0, PREVIEW_ERRORS),
          chart: thinPoints(read.rows, CHART_POINTS).map((r) => ({ volumeL: r.volumeL, dpBar: r.dpBar })),
          rowCount: read.rowCount,
          errorCount: read.errorCount,
          headers: read.headers,
          fingerprint,
          alreadyImported: earlier !== null,
        };
      }

      if (read.errorCount > 0) {
        const fieldsOut: Record<string, string> = {};
        for (const e of read.errors.slice(0, ERROR_FIELDS)) fieldsOut[`rows.${String(e.row)}`] ??= e.message;
        const n = read.errorCount;
        throw new HttpError(400, 'invalid_input', `Check the file: ${n.toLocaleString('en-US')} row${n === 1 ? ' is' : 's are'} not right, so none was stored.`, fieldsOut, {
          errors: read.errors.slice(0, PREVIEW_ERRORS),
          errorCount: n,
        });
      }
      if (earlier) return { imported: 0, skipped: read.rowCount, attachmentId: earlier.attachmentId };
      if (run.status !== 'running') throw conflict('This run is closed; it takes no more readings.', 'run_closed');

      const fileName = safeFileName(file.originalName || 'logger.csv');
      const storageKey = `wineries/${t.wineryId}/attachments/${randomUUID()}`;
      await storage.put(storageKey, file.buffer, 'text/csv');
      let keptFile = false;
      try {
        const result = await db.transaction(async (tx) => {
          // The run row share-locked until commit: readings share it, a close waits.
          const ctx = await runForBulkReadings(tx, t.wineryId, runId);
          if (!ctx) throw notFound('Run');
          if (ctx.status !== 'running') throw conflict('This run is closed; it takes no more readings.', 'run_closed');
          const logger = createLoggerRepository(tx);
          const claim = await logger.claimImport({
            wineryId: t.wineryId,
            runId,
            stageIndex: fields.stageIndex,
            fileSha256: fingerprint,
            fileName,
            rowCount: read.rowCount,
            importedCount: 0,
            profileId,
            mapping,
            createdBy: t.userId,
            createdByName: t.userName ?? null,
          });
          if (!claim) return { imported: 0, skipped: read.rowCount, attachmentId: null };
          const attachmentId = await insertAttachmentIn(tx, {
            wineryId: t.wineryId,
            ownerKind: 'run',
            ownerId: runId,
            fileName,
            contentType: 'text/csv',
            sizeBytes: file.buffer.byteLength,
            storageKey,
            uploadedBy: t.userId,
          });
          // Short keys keep the unique index small; 64 bits of the file's hash are unique enough within a run.
          const key = `lg:${fingerprint.slice(0, 16)}:${String(fields.stageIndex)}:`;
          const imported = await storeReadings(
            tx,
            read.rows.map((r) => ({
              wineryId: t.wineryId,
              runId,
              stageIndex: fields.stageIndex,
              at: new Date(r.at),
              volumeL: r.volumeL,
              upstreamBar: r.upstreamBar,
              downstreamBar: r.downstreamBar,
              flowLh: r.flowLh,
              tempC: r.tempC,
              clientKey: key + String(r.row),
              createdBy: t.userId,
              createdByName: t.userName ?? null,
            })),
          );
          await logger.finishImport(t.wineryId, claim.id, imported, attachmentId);
          await recordChange(tx, t, { action: 'import', kind: 'run', id: runId });
          return { imported, skipped: read.rowCount - imported, attachmentId };
        });
        keptFile = result.attachmentId !== null;
        return result;
      } finally {
        if (!keptFile) await storage.remove(storageKey).catch(() => undefined);
      }
    },
  };
}
