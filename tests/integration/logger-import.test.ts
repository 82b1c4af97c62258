// @vitest-environment node
import { randomUUID } from 'node:crypto';
import { sql } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { startedRunOn } from '../factories/plans';
import { setupApiApp } from '../support/api-app';
import { signUp, type Client } from '../support/test-app';

const app = setupApiApp({ withStorage: true, wineryName: 'Logger Import Winery', members: true, world: 'filled' });

const startedRun = () => startedRunOn(app.owner, app.world, app.members.technician);

type Fields = { stageIndex?: string | number; profileId?: string; mapping?: unknown };

/** The import form as a browser sends it: multipart with the file and the text fields. */
async function importFile(client: Client, runId: string, file: { name: string; text: string | Uint8Array } | null, fields: Fields, dryRun = false) {
  const form = new FormData();
  if (fields.stageIndex !== undefined) form.set('stageIndex', String(fields.stageIndex));
  if (fields.profileId) form.set('profileId', fields.profileId);
  if (fields.mapping !== undefined) form.set('mapping', typeof fields.mapping === 'string' ? fields.mapping : JSON.stringify(fields.mapping));
  if (file) {
    const bytes = typeof file.text === 'string' ? new TextEncoder().encode(file.text) : file.text;
    form.set('file', new Blob([bytes.slice()], { type: 'text/csv' }), file.name);
  }
  const headers: Record<string, string> = { origin: client.baseUrl };
  if (client.cookies.size) headers.cookie = [...client.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  const url = `${client.baseUrl}/api/runs/${runId}/readings/import${dryRun ? '?dryRun=true' : ''}`;
  // A kept-alive connection the server closed at the same moment is retried once, as a browser
  // would; an import is idempotent by the file's fingerprint, so a resend stores nothing twice.
  const res = await fetch(url, { method: 'POST', headers, body: form }).catch(() => fetch(url, { method: 'POST', headers, body: form }));
  return { status: res.status, body: (await res.json().catch(() => null)) as any };
}

async function storedReadings(runId: string) {
  const res = await app.db.execute(
    sql`select count(*)::int as n, coalesce(max(volume_l), 0)::float8 as max_v, coalesce(min(volume_l), 0)::float8 as min_v from run_readings where run_id = ${runId}::uuid`,
  );
  return res.rows[0] as { n: number; max_v: number; min_v: number };
}

/** A Vienna logger's export: semicolons, decimal commas, a totaliser in hL, psi and °F, a preamble line. */
const europeanMapping = {
  delimiter: ';',
  decimal: ',',
  timeZone: 'Europe/Vienna',
  time: { column: 'Datum/Zeit', format: 'DD.MM.YYYY HH:mm:ss' },
  volume: { column: 'Zähler hL', unit: 'hL', kind: 'totaliser' },
  upstream: { column: 'P vor (psi)', unit: 'psi' },
  downstream: { column: 'P nach (psi)', unit: 'psi' },
  flow: { column: 'Durchfluss', unit: 'L/h' },
  temp: { column: 'Temp °F', unit: 'degF' },
};
const europeanCsv = [
  'Gerät;DL-7 Kellerlogger;Serie 0042',
  'Datum/Zeit;Zähler hL;P vor (psi);P nach (psi);Durchfluss;Temp °F',
  '14.03.2026 08:00:00;1.250,00;20,0;14,5;2.400,0;50,0',
  '14.03.2026 08:10:00;1.254,00;21,0;14,5;2.400,0;50,9',
  '14.03.2026 08:20:00;1.258,00;22,5;14,5;2.400,0;51,8',
  '14.03.2026 08:30:00;1.262,00;24,5;14,5;2.400,0;52,7',
  '',
].join('\r\n');

describe('logger files', () => {
  it('a European CSV (semicolon, decimal comma, psi, °F): preview, import, and a second import adds nothing', async () => {
    const run = await startedRun();
    const file = { name: 'Kellerlogger März.csv', text: europeanCsv };
    const preview = await importFile(app.members.technician, run.id, file, { stageIndex: 0, mapping: europeanMapping }, true);
    expect(preview.status).toBe(200);
    expect(preview.body.errors).toEqual([]);
    expect(preview.body.rowCount).toBe(4);
    expect(preview.body.headers).toContain('Zähler hL');
    expect(preview.body.alreadyImported).toBe(false);
    const [a, , , d] = preview.body.rows;
    // Vienna is UTC+1 on 14 March (EU summer time starts on the last Sunday of March).
    expect(a).toMatchObject({ row: 3, at: '2026-03-14T07:00:00.000Z', volumeL: 0 });
    // 1 psi = 0.0689475729 bar (NIST SP 811 App. B.8); (°F − 32) × 5/9; 1 hL = 100 L.
    expect(a.upstreamBar).toBeCloseTo(20 * 0.0689475729, 8);
    expect(a.downstreamBar).toBeCloseTo(14.5 * 0.0689475729, 8);
    expect(a.tempC).toBeCloseTo(10, 9);
    expect(d.volumeL).toBeCloseTo(1200, 6);
    expect(d.flowLh).toBe(2400);
    expect(preview.body.chart).toHaveLength(4);
    expect(preview.body.chart[3].dpBar).toBeCloseTo(10 * 0.0689475729, 8);
    expect((await storedReadings(run.id)).n).toBe(0);

    const first = await importFile(app.members.technician, run.id, file, { stageIndex: 0, mapping: europeanMapping });
    expect(first.status).toBe(200);
    expect(first.body).toMatchObject({ imported: 4, skipped: 0, attachmentId: expect.any(String) });
    const stored = await storedReadings(run.id);
    expect(stored.n).toBe(4);
    expect(stored.max_v).toBeCloseTo(1200, 6);

    // The same file again, as a preview and as an import: nothing more is stored.
    expect((await importFile(app.members.technician, run.id, file, { stageIndex: 0, mapping: europeanMapping }, true)).body.alreadyImported).toBe(true);
    const again = await importFile(app.members.technician, run.id, file, { stageIndex: 0, mapping: europeanMapping });
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ imported: 0, skipped: 4 });
    // Sent twice at once: still stored once.
    const twice = await Promise.all([1, 2].map(() => importFile(app.owner, run.id, file, { stageIndex: 1, mapping: europeanMapping })));
    expect(twice.map((x) => x.status)).toEqual([200, 200]);
    expect(twice.map((x) => x.body.imported).sort()).toEqual([0, 4]);
    expect((await storedReadings(run.id)).n).toBe(8);

    // The original file is kept as an attachment of the run, byte for byte.
    const files = await app.owner.get(`/api/attachments?ownerKind=run&ownerId=${run.id}`);
    expect(files.status).toBe(200);
    expect(files.body.items.map((x: { fileName: string }) => x.fileName)).toEqual(['Kellerlogger März.csv', 'Kellerlogger März.csv']);
    const download = await fetch(`${app.owner.baseUrl}${files.body.items[0].downloadUrl as string}`, { headers: { cookie: [...app.owner.cookies].map(([k, v]) => `${k}=${v}`).join('; ') } });
    expect(await download.text()).toBe(europeanCsv);

    // The run's figures count the imported readings; the change log names the import.
    const detail = await app.owner.get(`/api/runs/${run.id}`);
    expect(detail.body.readingCount).toBe(8);
    expect(detail.body.stages[0].readings).toHaveLength(4);
    const log = await app.db.execute(sql`select count(*)::int as n from audit_events where record_id = ${run.id} and action = 'import'`);
    expect((log.rows[0] as { n: number }).n).toBe(2);
  });

  it('a bad row names its row and nothing is stored; a missing column or an unreadable file says which', async () => {
    const run = await startedRun();
    const bad = europeanCsv.replace('14.03.2026 08:20:00;1.258,00;22,5', '14.03.2026 08:05:00;1.258,00;22,5').replace('1.262,00;24,5', '1.262,00;24.5');
    const res = await importFile(app.members.technician, run.id, { name: 'bad.csv', text: bad }, { stageIndex: 0, mapping: europeanMapping });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/2 rows are not right, so none was stored/);
    expect(res.body.error.fields['rows.5']).toMatch(/Row 5: the time goes backwards/);
    expect(res.body.error.fields['rows.6']).toMatch(/Row 6: .*“24.5” is not a number with a decimal comma/);
    expect(res.body.error.errors).toHaveLength(2);
    const preview = await importFile(app.members.technician, run.id, { name: 'bad.csv', text: bad }, { stageIndex: 0, mapping: europeanMapping }, true);
    expect(preview.status).toBe(200);
    expect(preview.body.errors.map((e: { row: number }) => e.row)).toEqual([5, 6]);
    expect(preview.body.rows.map((r: { row: number }) => r.row)).toEqual([3, 4]);

    const missing = await importFile(app.members.technician, run.id, { name: 'x.csv', text: europeanCsv }, { stageIndex: 0, mapping: { ...europeanMapping, time: { column: 'Zeitstempel' } } });
    expect(missing.status).toBe(400);
    expect(missing.body.error.fields['mapping.time.column']).toMatch(/no column “Zeitstempel”/);
    const binary = await importFile(app.members.technician, run.id, { name: 'x.csv', text: new Uint8Array([0x50, 0x4b, 3, 4, 0, 0, 1]) }, { stageIndex: 0, mapping: europeanMapping });
    expect(binary.status).toBe(400);
    expect(binary.body.error.fields.file).toMatch(/Not a CSV or TSV/);
    const empty = await importFile(app.members.technician, run.id, { name: 'x.csv', text: 'Datum/Zeit;Zähler hL;P vor (psi);P nach (psi);Durchfluss;Temp °F\n' }, { stageIndex: 0, mapping: europeanMapping });
    expect(empty.status).toBe(400);
    expect((await storedReadings(run.id)).n).toBe(0);
  });

  it('a Windows-1252 file (as older loggers write) is read with its accented headers', async () => {
    const run = await startedRun();
    const latin1 = Uint8Array.from([...europeanCsv].map((c) => c.charCodeAt(0)));
    expect(latin1.includes(0xe4)).toBe(true); // ä as one byte
    const res = await importFile(app.members.technician, run.id, { name: 'alt.csv', text: latin1 }, { stageIndex: 0, mapping: europeanMapping }, true);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ rowCount: 4, errorCount: 0 });
    expect(res.body.headers).toContain('Zähler hL');
  });

  it('a mapping without litres or flow, or without pressures, is a 400 with field messages', async () => {
    const run = await startedRun();
    const file = { name: 'a.csv', text: europeanCsv };
    const { volume: _v, flow: _f, ...noLitres } = europeanMapping;
    const a = await importFile(app.members.technician, run.id, file, { stageIndex: 0, mapping: noLitres });
    expect(a.status).toBe(400);
    expect(a.body.error.fields['mapping.volume']).toMatch(/Map the litres/);
    expect(a.body.error.fields['mapping.flow']).toBeDefined();
    const { downstream: _d, ...noDownstream } = europeanMapping;
    const b = await importFile(app.members.technician, run.id, file, { stageIndex: 0, mapping: noDownstream });
    expect(b.status).toBe(400);
    expect(b.body.error.fields['mapping.downstream']).toMatch(/downstream/);
    expect(b.body.error.fields['mapping.dp']).toBeDefined();
    const c = await importFile(app.members.technician, run.id, file, { stageIndex: 0, mapping: { ...europeanMapping, decimal: ':', upstream: { column: 'P', unit: 'mmHg' } } });
    expect(c.body.error.fields).toMatchObject({ 'mapping.decimal': expect.any(String), 'mapping.upstream.unit': expect.stringMatching(/bar, psi, kPa/) });
    expect((await importFile(app.members.technician, run.id, file, { stageIndex: 0, mapping: '{not json' })).body.error.fields.mapping).toMatch(/not valid JSON/);
    expect((await importFile(app.members.technician, run.id, file, { stageIndex: 0 })).body.error.fields.mapping).toMatch(/profile or map/);
    expect((await importFile(app.members.technician, run.id, file, { mapping: europeanMapping })).body.error.fields.stageIndex).toBeDefined();
    expect((await importFile(app.members.technician, run.id, file, { stageIndex: 9, mapping: europeanMapping })).body.error.fields.stageIndex).toMatch(/stage of this run/);
    expect((await importFile(app.members.technician, run.id, null, { stageIndex: 0, mapping: europeanMapping })).body.error.fields.file).toMatch(/Choose the logger file/);
    // Profiles are checked by the same schema.
    const p = await app.members.technician.post('/api/logger-profiles', { name: 'No pressures', mapping: { decimal: '.', time: { column: 't' }, flow: { column: 'f', unit: 'L/h' } } });
    expect(p.status).toBe(400);
    expect(Object.keys(p.body.error.fields)).toEqual(expect.arrayContaining(['mapping.upstream', 'mapping.downstream', 'mapping.dp']));
  });

  it('100,000 rows in one import (a TSV with a flow to integrate and ΔP alone), stored once', async () => {
    const run = await startedRun();
    const start = Date.UTC(2026, 2, 14, 6, 0, 0) / 1000;
    const lines = ['time\tflow_gpm\tdp_kpa'];
    for (let i = 0; i < 100_000; i++) lines.push(`${String(start + i)}\t10.5\t${(40 + i / 2000).toFixed(3)}`);
    const mapping = { delimiter: '\t', decimal: '.', time: { column: 'time', format: 'epoch-s' }, flow: { column: 'flow_gpm', unit: 'gal/min' }, dp: { column: 'dp_kpa', unit: 'kPa' } };
    const res = await importFile(app.members.technician, run.id, { name: 'long.tsv', text: lines.join('\n') }, { stageIndex: 1, mapping });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ imported: 100_000, skipped: 0 });
    const stored = await storedReadings(run.id);
    expect(stored.n).toBe(100_000);
    // 10.5 gal/min for 99,999 s: 10.5 × 3.785411784 L × 99,999/60 (NIST Handbook 44 App. C gallon).
    expect(stored.max_v).toBeCloseTo((10.5 * 3.785411784 * 99_999) / 60, 3);
    const again = await importFile(app.members.technician, run.id, { name: 'long again.tsv', text: lines.join('\n') }, { stageIndex: 1, mapping });
    expect(again.body).toMatchObject({ imported: 0, skipped: 100_000 });
    expect((await storedReadings(run.id)).n).toBe(100_000);
  }, 120_000);

  it('a closed run takes no file; saved profiles import in two steps (profile, file)', async () => {
    const run = await startedRun();
    const saved = await app.members.winemaker.post('/api/logger-profiles', { name: `DL-7 ${randomUUID().slice(0, 6)}`, mapping: europeanMapping });
    expect(saved.status).toBe(201);
    expect(saved.body.mapping.time.column).toBe('Datum/Zeit');
    const res = await importFile(app.members.technician, run.id, { name: 'p.csv', text: europeanCsv }, { stageIndex: 0, profileId: saved.body.id });
    expect(res.body).toMatchObject({ imported: 4, skipped: 0 });
    expect((await importFile(app.members.technician, run.id, { name: 'p.csv', text: europeanCsv }, { stageIndex: 0, profileId: randomUUID() })).status).toBe(404);
    expect((await app.members.technician.post(`/api/runs/${run.id}/close`)).status).toBe(200);
    const late = await importFile(app.members.technician, run.id, { name: 'other.csv', text: europeanCsv.replace('50,0', '50,1') }, { stageIndex: 0, profileId: saved.body.id });
    expect(late.status).toBe(409);
    expect(late.body.error.code).toBe('run_closed');
    // the file already imported still answers as already there
    expect((await importFile(app.members.technician, run.id, { name: 'p.csv', text: europeanCsv }, { stageIndex: 0, profileId: saved.body.id })).body).toMatchObject({ imported: 0, skipped: 4 });
  });
});

describe('logger profiles', () => {
  it('list, create, rename, change the mapping and delete; names are unique per winery', async () => {
    const name = `Cellar logger ${randomUUID().slice(0, 6)}`;
    const created = await app.members['cellar-master'].post('/api/logger-profiles', { name, mapping: europeanMapping });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ name, createdByName: 'Test cellar-master' });
    const dup = await app.members.technician.post('/api/logger-profiles', { name, mapping: europeanMapping });
    expect(dup.status).toBe(409);
    expect(dup.body.error.fields.name).toMatch(/taken/);
    const list = await app.members.auditor.get('/api/logger-profiles');
    expect(list.status).toBe(200);
    expect(list.body.items.map((p: { name: string }) => p.name)).toContain(name);
    const renamed = await app.members.technician.patch(`/api/logger-profiles/${created.body.id as string}`, { name: `${name} (new)`, mapping: { ...europeanMapping, timeZone: 'UTC' } });
    expect(renamed.status).toBe(200);
    expect(renamed.body.mapping.timeZone).toBe('UTC');
    expect((await app.members.technician.patch(`/api/logger-profiles/${created.body.id as string}`, {})).status).toBe(400);
    expect((await app.members.technician.patch(`/api/logger-profiles/${created.body.id as string}`, { mapping: { ...europeanMapping, timeZone: 'Europe/Atlantis' } })).body.error.fields['mapping.timeZone']).toMatch(/time zone/);
    expect((await app.members.technician.delete(`/api/logger-profiles/${created.body.id as string}`)).status).toBe(204);
    expect((await app.members.technician.delete(`/api/logger-profiles/${created.body.id as string}`)).status).toBe(404);
  });

  it('roles: those who log readings save profiles and import; the auditor reads only', async () => {
    const run = await startedRun();
    const mapping = europeanMapping;
    for (const role of ['cellar-master', 'winemaker', 'technician'] as const) {
      const p = await app.members[role].post('/api/logger-profiles', { name: `By ${role} ${randomUUID().slice(0, 6)}`, mapping });
      expect(p.status).toBe(201);
      expect((await importFile(app.members[role], run.id, { name: 'r.csv', text: europeanCsv }, { stageIndex: 0, mapping }, true)).status).toBe(200);
    }
    const mine = await app.owner.post('/api/logger-profiles', { name: `By owner ${randomUUID().slice(0, 6)}`, mapping });
    expect(mine.status).toBe(201);
    const id = mine.body.id as string;
    expect((await app.members.auditor.post('/api/logger-profiles', { name: 'Auditor’s', mapping })).status).toBe(403);
    expect((await app.members.auditor.patch(`/api/logger-profiles/${id}`, { name: 'x' })).status).toBe(403);
    expect((await app.members.auditor.delete(`/api/logger-profiles/${id}`)).status).toBe(403);
    expect((await importFile(app.members.auditor, run.id, { name: 'r.csv', text: europeanCsv }, { stageIndex: 0, mapping }, true)).status).toBe(403);
    expect((await importFile(app.members.auditor, run.id, { name: 'r.csv', text: europeanCsv }, { stageIndex: 0, mapping })).status).toBe(403);
    expect((await storedReadings(run.id)).n).toBe(0);
  });

  it('another winery gets 404 on every new route', async () => {
    const run = await startedRun();
    const saved = await app.owner.post('/api/logger-profiles', { name: `Ours ${randomUUID().slice(0, 6)}`, mapping: europeanMapping });
    const id = saved.body.id as string;
    const other = (await signUp(app.baseUrl, { wineryName: 'Other Logger Winery' })).client;
    expect((await other.patch(`/api/logger-profiles/${id}`, { name: 'Taken over' })).status).toBe(404);
    expect((await other.delete(`/api/logger-profiles/${id}`)).status).toBe(404);
    expect((await other.get('/api/logger-profiles')).body.items).toEqual([]);
    const file = { name: 'o.csv', text: europeanCsv };
    expect((await importFile(other, run.id, file, { stageIndex: 0, mapping: europeanMapping }, true)).status).toBe(404);
    expect((await importFile(other, run.id, file, { stageIndex: 0, mapping: europeanMapping })).status).toBe(404);
    // Their own run cannot use our profile either.
    const theirs = await other.post('/api/logger-profiles', { name: 'Theirs', mapping: europeanMapping });
    expect(theirs.status).toBe(201);
    expect((await importFile(app.owner, run.id, file, { stageIndex: 0, profileId: theirs.body.id })).status).toBe(404);
    expect((await importFile(app.owner, 'not-a-uuid', file, { stageIndex: 0, mapping: europeanMapping })).status).toBe(404);
    expect((await storedReadings(run.id)).n).toBe(0);
    expect((await app.owner.get('/api/logger-profiles')).body.items.map((p: { id: string }) => p.id)).toContain(id);
  });
});
