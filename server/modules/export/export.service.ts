import { createHash } from 'node:crypto';
import { Readable, Transform, pipeline, type Writable } from 'node:stream';
import { ZipArchive } from 'archiver';
import type { Database } from '../../db/client';
import { csvStream } from '../../lib/csv';
import { notFound } from '../../lib/errors';
import type { Storage } from '../../lib/storage';
import { createRecordsService } from '../records/records.service';
import type { TenantContext } from '../../middleware/authorize';
import { createExportRepository, exportHeader, exportTables } from './export.repository';

export type ExportFileEntry = { file: string; rows?: number; bytes: number; sha256: string };

export type ExportManifest = {
  format: 'porewise-winery-export';
  version: 1;
  winery: { id: string; name: string };
  exportedAt: string;
  exportedBy: string;
  /** Rows per CSV (by file name, without ".csv"). */
  counts: Record<string, number>;
  files: ExportFileEntry[];
  attachments: ExportFileEntry[];
  /** Each bottled lot's filtration record fingerprint (SHA-256 of its canonical JSON), to check printed copies. */
  records: { lotId: string; lotCode: string; fingerprint: string }[];
  notes: string[];
};

/** A file name safe inside a zip: no folders, no control characters. */
const zipSafe = (name: string) =>
  [...name]
    .map((ch) => (ch.charCodeAt(0) < 32 || '\\/:*?"<>|'.includes(ch) ? '_' : ch))
    .join('')
    .slice(0, 150) || 'file';

/**
 * The whole winery as one zip, streamed: a CSV per kind of record (read from the database in
 * pages), every attachment's file (one at a time from storage), and manifest.json with the
 * row counts and each file's SHA-256. Entries are written one after the other, so memory holds
 * one page of rows or one attachment at a time.
 */
export function createExportService({ db, storage }: { db: Database; storage: Storage }) {
  const recordsService = createRecordsService(db);
  const repo = createExportRepository(db);

  return {
    async wineryName(tenant: TenantContext) {
      const w = await repo.winery(tenant.wineryId);
      if (!w) throw notFound('Winery');
      return w.name;
    },

    async writeZip(tenant: TenantContext, out: Writable, exportedBy: string, now = new Date()) {
      const winery = await repo.winery(tenant.wineryId);
      if (!winery) throw notFound('Winery');
      const archive = new ZipArchive({ zlib: { level: 6 } });
      let failure: Error | null = null;
      archive.on('error', (e) => {
        failure = e;
      });
      archive.on('warning', (e) => {
        failure = e;
      });
      archive.pipe(out);

      /** Appends one entry and waits until the archive has written it. */
      const add = (source: Readable | Buffer, name: string) =>
        new Promise<void>((resolve, reject) => {
          const onError = (e: Error) => {
            archive.off('entry', onEntry);
            reject(e);
          };
          const onEntry = () => {
            archive.off('error', onError);
            resolve();
          };
          archive.once('entry', onEntry);
          archive.once('error', onError);
          if (source instanceof Readable) source.once('error', onError);
          archive.append(source, { name, date: now });
        });

      const csvEntry = async (file: string, header: string[], rows: AsyncIterable<unknown[]> | Iterable<unknown[]>): Promise<ExportFileEntry> => {
        const hash = createHash('sha256');
        let bytes = 0;
        let count = 0;
        const counted = Readable.from(
          (async function* () {
            for await (const r of rows) {
              count++;
              yield r;
            }
          })(),
        );
        const tap = new Transform({
          transform(chunk: Buffer, _enc, cb) {
            hash.update(chunk);
            bytes += chunk.length;
            cb(null, chunk);
          },
        });
        const source = pipeline(counted, csvStream(header), tap, () => undefined);
        await add(source, file);
        return { file, rows: count, bytes, sha256: hash.digest('hex') };
      };

      const files: ExportFileEntry[] = [];
      for (const spec of exportTables) files.push(await csvEntry(spec.file, exportHeader(spec.table), repo.rows(spec, tenant.wineryId)));
      const members = await repo.members(tenant.wineryId);
      files.push(
        await csvEntry(
          'members.csv',
          ['user_id', 'name', 'email', 'role', 'joined_at'],
          members.map((m) => [m.userId, m.name, m.email, m.role, m.joinedAt]),
        ),
      );

      const attachments: ExportFileEntry[] = [];
      const notes: string[] = [];
      for await (const a of repo.attachments(tenant.wineryId)) {
        const file = `attachments/${a.ownerKind}/${a.id}-${zipSafe(a.fileName)}`;
        let body: Uint8Array;
        try {
          body = (await storage.get(a.storageKey)).body;
        } catch {
          notes.push(`The file of attachment ${a.id} (${a.fileName}) could not be read from storage; its row is in attachments.csv.`);
          continue;
        }
        const buffer = Buffer.from(body);
        await add(buffer, file);
        attachments.push({ file, bytes: buffer.byteLength, sha256: createHash('sha256').update(buffer).digest('hex') });
      }

      // One record at a time, page by page: memory does not grow with the winery's history.
      const records: ExportManifest['records'] = [];
      for (let page = 1; ; page++) {
        const { items, total } = await recordsService.list(tenant, { page, pageSize: 100 } as Parameters<typeof recordsService.list>[1]);
        for (const item of items) {
          const r = await recordsService.record(tenant, item.lotId, now);
          records.push({ lotId: item.lotId, lotCode: r.lot.code, fingerprint: r.fingerprint });
        }
        if (items.length === 0 || page * 100 >= total) break;
      }

      const manifest: ExportManifest = {
        format: 'porewise-winery-export',
        version: 1,
        winery: { id: winery.id, name: winery.name },
        exportedAt: now.toISOString(),
        exportedBy,
        counts: Object.fromEntries(files.map((f) => [f.file.replace(/\.csv$/, ''), f.rows ?? 0])),
        files,
        attachments,
        records,
        notes,
      };
      await add(Buffer.from(JSON.stringify(manifest, null, 2)), 'manifest.json');
      await archive.finalize();
      if (failure) throw failure;
    },
  };
}
