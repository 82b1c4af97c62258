// @vitest-environment node
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Role } from '../../shared/permissions';
import type { FilterRecordDto, RecordLotListDto } from '../../shared/types/records';
import { runReadingsTable } from '../../server/db/schema';
import { canonicalJson, sha256OfCanonical } from '../../server/lib/canonical-json';
import { neutraliseCell as csvSafeCell } from '../../server/lib/csv';
import { createBottledLot, createRecordWorld, logReadings, startRunOf, type BottledWorld } from '../factories/records';
import { createLot } from '../factories/cellar';
import { addMember, signUp, startTestApp, type Client, type TestApp } from '../support/test-app';

let app: TestApp;
let owner: Client;
let stranger: Client;
const members = {} as Record<Exclude<Role, 'owner'>, Client>;
let bottled: Awaited<ReturnType<typeof createBottledLot>>;
let world: BottledWorld;
const INJECTION = '=HYPERLINK("http://x.test","click")';

beforeAll(async () => {
  app = await startTestApp();
  owner = (await signUp(app.baseUrl, { name: 'Rosa Owner', wineryName: 'Records Test Winery' })).client;
  for (const role of ['cellar-master', 'winemaker', 'technician', 'auditor'] as const) members[role] = (await addMember(app, owner, role)).client;
  stranger = (await signUp(app.baseUrl, { wineryName: 'Another Winery' })).client;
  world = await createRecordWorld(owner, { batch: '@BATCH-7' });
  bottled = await createBottledLot(owner, { world, lot: { name: INJECTION }, notes: '+41 call the lab; -check filler' });
}, 120_000);
afterAll(async () => {
  await app?.close();
});

const getRecord = async (client: Client, lotId: string) => {
  const res = await client.get(`/api/records/lots/${lotId}`);
  expect(res.status).toBe(200);
  return res.body as FilterRecordDto;
};

describe('canonical JSON and the CSV neutraliser', () => {
  it('sorts keys at every depth and leaves no whitespace (common practice, no source)', () => {
    expect(canonicalJson({ b: 1, a: [{ d: 'x', c: null }, 2.5], e: undefined })).toBe('{"a":[{"c":null,"d":"x"},2.5],"b":1}');
    expect(() => canonicalJson({ a: Number.NaN })).toThrow(RangeError);
    // SHA-256 of the ASCII text "{}" checked with `printf '{}' | sha256sum` (GNU coreutils).
    expect(sha256OfCanonical({})).toBe('44136fa355b3678a1146ad16f7e8649e94fb4fc21fe77e8310c060f61caaff8a');
  });

  it('neutralises =, +, -, @, tab and CR at the start of text cells (OWASP CSV injection guidance)', () => {
    for (const bad of ['=1+1', '+1', '-1', '@SUM(A1)', '\tx', '\rx']) expect(csvSafeCell(bad)).toBe(`'${bad}`);
    expect(csvSafeCell('plain')).toBe('plain');
    expect(csvSafeCell(-0.5)).toBe('-0.5');
    expect(csvSafeCell(Number.POSITIVE_INFINITY)).toBe('');
  });
});

describe('the bottling filtration record', () => {
  it('holds the lot, analyses, plan, cartridges, sanitation, integrity before and after, readings, fit and notes', async () => {
    const r = await getRecord(members.auditor, bottled.lotId);
    expect(r.schemaVersion).toBe(2);
    expect(r.lot).toMatchObject({ id: bottled.lotId, code: bottled.lotCode, name: INJECTION, style: 'white', volumeL: 6000 });
    expect(r.runs).toHaveLength(1);
    const run = r.runs[0];
    expect(run).toMatchObject({ id: bottled.runId, status: 'closed', startedByName: 'Rosa Owner', closedByName: 'Rosa Owner', volumeFilteredL: 4000, notes: '+41 call the lab; -check filler' });
    // 4,000 L at 750 mL a bottle: 5,333 whole bottles (4,000,000 mL / 750 mL = 5,333.3).
    expect(run.bottles).toBe(5333);
    expect(run.analyses).toMatchObject({ turbidityNtu: 0.6, cloggingIndex: 10 });
    expect(['ready', 'borderline', 'not-ready', 'unknown']).toContain(run.readiness.verdict);
    expect(run.plan).toMatchObject({ name: bottled.planName, approvedByName: 'Rosa Owner', sizingSource: 'frozen-at-approval', bottleMl: 750 });
    expect(run.plan.approvedAt).toBeTruthy();
    expect(run.plan.sizing?.stages.map((s) => s.kind)).toEqual(['prefilter', 'membrane']);
    expect(run.plan.sizing?.batchL).toBe(4000);
    expect(run.overrideReason).toBeNull();

    const [pre, mem] = run.stages;
    expect(pre.cartridges.map((c) => c.serial).sort()).toEqual([...world.preSerials].sort());
    expect(mem.cartridges.map((c) => c.serial).sort()).toEqual([...world.memSerials].sort());
    for (const c of [...pre.cartridges, ...mem.cartridges]) {
      expect(c.litresCarried).toBe(4000);
      expect(c.litresAtStart).toBe(0);
      expect(c.cyclesAtStart).toEqual({ steam: 0, hotWater: 1, chemical: 0 });
    }
    expect(mem.cartridges[0]).toMatchObject({ batch: '@BATCH-7', ratingUm: 0.45, lengthIn: 30, kind: 'membrane' });
    expect(pre.integrity).toBeNull();
    expect(pre.sanitation).toHaveLength(3);
    expect(mem.sanitation.every((s) => s.kind === 'hot-water' && s.tempC === 80 && s.byName === 'Rosa Owner')).toBe(true);
    expect(mem.integrity?.before).toHaveLength(3);
    expect(mem.integrity?.after).toHaveLength(3);
    expect(mem.integrity?.before[0]).toMatchObject({ test: 'bubble-point', measured: 3.6, limit: 3.2, limitKind: 'min', unit: 'bar', pass: true, byName: 'Rosa Owner' });
    expect(mem.integrity?.after[0]).toMatchObject({ measured: 3.5, pass: true });
    expect(mem.integrity?.status).toBe('proven');
    expect(mem.integrity?.statement).toBe('4,000 L (5,333 bottles of 750 mL) were filtered between two passing integrity tests of every membrane cartridge in this stage.');
    expect(mem.readings).toHaveLength(4);
    expect(mem.readings[0]).toMatchObject({ volumeL: 1000, voided: false, corrections: [] });
    expect(mem.fit).not.toBeNull();
    expect(mem.fit!.n).toBe(4);
    expect(mem.curve.length).toBeGreaterThan(1);
    expect(mem.finalDpBar).toBeCloseTo(0.15 + 0.15 + 0.18, 6);
    expect(mem.terminalDpBar).toBe(1.5);
    expect(mem.changes).toEqual([]);
    expect(r.fingerprint).toMatch(/^[0-9a-f]{64}$/);
    const { fingerprint, generatedAt, ...content } = r;
    expect(sha256OfCanonical(content)).toBe(fingerprint);
    expect(Date.parse(generatedAt)).not.toBeNaN();
  });

  it('fingerprint: the same record gives the same fingerprint at another time, and changes when the data changes', async () => {
    const a = await getRecord(owner, bottled.lotId);
    await new Promise((r) => setTimeout(r, 5));
    const b = await getRecord(members.technician, bottled.lotId);
    expect(b.fingerprint).toBe(a.fingerprint);
    expect(b.generatedAt).not.toBe(a.generatedAt);

    // A second lot whose record we then change underneath (a reading's value edited in the database).
    const other = await createBottledLot(owner, { world });
    const before = await getRecord(owner, other.lotId);
    const [reading] = await app.db.select().from(runReadingsTable).where(eq(runReadingsTable.runId, other.runId)).limit(1);
    await app.db.update(runReadingsTable).set({ upstreamBar: reading.upstreamBar + 0.01 }).where(eq(runReadingsTable.id, reading.id));
    const after = await getRecord(owner, other.lotId);
    expect(after.fingerprint).not.toBe(before.fingerprint);

    const yes = await members.auditor.post('/api/records/verify', { lotId: other.lotId, fingerprint: after.fingerprint.toUpperCase() });
    expect(yes.status).toBe(200);
    expect(yes.body).toEqual({ matches: true });
    const no = await members.auditor.post('/api/records/verify', { lotId: other.lotId, fingerprint: before.fingerprint });
    expect(no.body).toEqual({ matches: false });
    const bad = await members.auditor.post('/api/records/verify', { lotId: other.lotId, fingerprint: 'abc' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.fingerprint).toMatch(/64 characters/);
  });

  it('warns where a passing test after the run is missing, and reads the lot’s earlier tests as “before”', async () => {
    const lot = await createLot(owner, { volumeL: 3000, name: 'No after test' });
    const { runId } = await startRunOf(owner, world, lot.id, 2000);
    await logReadings(owner, runId, [500, 1000, 1500]);
    let r = await getRecord(owner, lot.id);
    expect(r.runs[0].status).toBe('running');
    expect(r.runs[0].stages[1].integrity?.statement).toMatch(/still open/);
    expect(r.runs[0].stages[0].cartridges.every((c) => c.litresCarried === null)).toBe(true);
    expect((await owner.post(`/api/runs/${runId}/close`, {})).status).toBe(200);
    r = await getRecord(owner, lot.id);
    const mem = r.runs[0].stages[1];
    expect(mem.integrity?.status).toBe('warning');
    expect(mem.integrity?.statement).toMatch(/^Warning: .* has no integrity test after the run/);
    expect(mem.integrity?.statement).toMatch(/1,500 L filtered through this stage are not proven/);
    expect(mem.integrity?.before.every((t) => t.pass)).toBe(true);
    expect(r.runs[0].analyses).toBeNull();
    // Litres and cycles at start count the earlier runs (4,000 L each, before this run).
    expect(mem.cartridges[0].litresAtStart).toBeGreaterThanOrEqual(8000);
    expect(mem.sanitation).toEqual([]);
  });

  it('the bottled-lots list filters by text, style, date and finds every lot a cartridge serial or batch filtered', async () => {
    const all = await members.auditor.get('/api/records/lots');
    expect(all.status).toBe(200);
    const list = all.body as RecordLotListDto;
    expect(list.items.some((i) => i.lotId === bottled.lotId)).toBe(true);
    const item = list.items.find((i) => i.lotId === bottled.lotId)!;
    expect(item).toMatchObject({ code: bottled.lotCode, runCount: 1, volumeFilteredL: 4000, planNames: [bottled.planName] });

    const bySerial = (await members.auditor.get(`/api/records/lots?serial=${encodeURIComponent(world.memSerials[1].toLowerCase())}`)).body as RecordLotListDto;
    expect(bySerial.items.map((i) => i.lotId)).toContain(bottled.lotId);
    expect(bySerial.total).toBeGreaterThanOrEqual(3);
    const byBatch = (await members.auditor.get(`/api/records/lots?batch=${encodeURIComponent('@BATCH-7')}`)).body as RecordLotListDto;
    expect(byBatch.total).toBe(bySerial.total);
    const none = (await members.auditor.get('/api/records/lots?serial=NO-SUCH-SERIAL')).body as RecordLotListDto;
    expect(none).toEqual({ items: [], total: 0 });

    const byCode = (await owner.get(`/api/records/lots?q=${encodeURIComponent(bottled.lotCode)}`)).body as RecordLotListDto;
    expect(byCode.items.map((i) => i.lotId)).toEqual([bottled.lotId]);
    expect(((await owner.get('/api/records/lots?style=red')).body as RecordLotListDto).total).toBe(0);
    const today = new Date().toISOString().slice(0, 10);
    expect(((await owner.get(`/api/records/lots?from=${today}&to=${today}`)).body as RecordLotListDto).total).toBeGreaterThanOrEqual(1);
    expect(((await owner.get('/api/records/lots?to=2001-01-01')).body as RecordLotListDto).total).toBe(0);
    const paged = (await owner.get('/api/records/lots?pageSize=1&page=2')).body as RecordLotListDto;
    expect(paged.items).toHaveLength(1);
    expect(paged.total).toBe(list.total);

    const bad = await owner.get('/api/records/lots?from=2025-13-01&style=blue&page=0');
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['from', 'page', 'style']);
    const backwards = await owner.get('/api/records/lots?from=2025-02-01&to=2025-01-01');
    expect(backwards.status).toBe(400);
    expect(backwards.body.error.fields.to).toMatch(/before/);
  });

  it('every role reads and exports records; signed-out people get 401; another winery gets 404 everywhere', async () => {
    for (const c of [owner, ...Object.values(members)]) {
      expect((await c.get('/api/records/lots')).status).toBe(200);
      expect((await c.get(`/api/records/lots/${bottled.lotId}`)).status).toBe(200);
      expect((await c.get(`/api/records/lots/${bottled.lotId}/csv`)).status).toBe(200);
    }
    const anon = new (owner.constructor as new (u: string) => Client)(app.baseUrl);
    expect((await anon.get('/api/records/lots')).status).toBe(401);
    expect((await anon.get(`/api/records/lots/${bottled.lotId}/pdf`)).status).toBe(401);

    for (const path of [`/api/records/lots/${bottled.lotId}`, `/api/records/lots/${bottled.lotId}/pdf`, `/api/records/lots/${bottled.lotId}/csv`, '/api/records/lots/not-a-uuid']) {
      expect((await stranger.get(path)).status).toBe(404);
    }
    const verify = await stranger.post('/api/records/verify', { lotId: bottled.lotId, fingerprint: 'a'.repeat(64) });
    expect(verify.status).toBe(404);
    expect(((await stranger.get(`/api/records/lots?serial=${encodeURIComponent(world.memSerials[0])}`)).body as RecordLotListDto).total).toBe(0);
    // A lot without a run has no record yet.
    const fresh = await createLot(owner, {});
    expect((await owner.get(`/api/records/lots/${fresh.id}`)).status).toBe(404);
    expect((await owner.get(`/api/records/lots/${bottled.lotId}/pdf?paper=legal`)).status).toBe(400);
  });

  it('the CSV parses back with papaparse, carries every serial and the fingerprint, and neutralises injection cells', async () => {
    const res = await members.auditor.get(`/api/records/lots/${bottled.lotId}/csv`);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/^text\/csv/);
    expect(res.headers.get('content-disposition')).toMatch(/attachment; filename="filtration-record-.*\.csv"/);
    const parsed = Papa.parse<string[]>(res.text, { skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    const rows = parsed.data;
    const fingerprint = res.headers.get('x-record-fingerprint')!;
    expect(rows.find((r) => r[0] === 'record')![1]).toBe(fingerprint);
    expect(rows.find((r) => r[0] === 'record')![4]).toBe(`'${INJECTION}`);
    const cartridges = rows.filter((r) => r[0] === 'cartridge');
    expect(cartridges.map((r) => r[4]).sort()).toEqual([...world.preSerials, ...world.memSerials].sort());
    expect(cartridges.filter((r) => r[5] === "'@BATCH-7")).toHaveLength(3);
    expect(rows.find((r) => r[0] === 'run')).toContain("'+41 call the lab; -check filler");
    expect(rows.filter((r) => r[0] === 'integrity').map((r) => r[10])).toEqual(['pass', 'pass', 'pass', 'pass', 'pass', 'pass']);
    expect(rows.filter((r) => r[0] === 'reading')).toHaveLength(8);
    for (const cell of rows.flat()) expect(cell).not.toMatch(/^[=+\-@\t\r]/);
  });

  it('the PDF holds every serial, the pass/fail words and the fingerprint (read by pdftotext, poppler-utils)', async () => {
    // A failed test after the run, so FAIL appears too.
    const failing = await createBottledLot(owner, { testAfter: false });
    await (async () => {
      for (const id of failing.world.memIds) {
        const res = await owner.post(`/api/cartridges/${id}/integrity-tests`, { test: 'bubble-point', bubblePointBar: 2.1, wettingFluid: 'water' });
        expect(res.status).toBe(201);
      }
    })();
    const dir = mkdtempSync(join(process.env.TMPDIR ?? '/tmp', 'porewise-pdf-'));
    try {
      for (const [lotId, w, paper, word] of [
        [bottled.lotId, world, 'a4', 'PASS'],
        [failing.lotId, failing.world, 'letter', 'FAIL'],
      ] as const) {
        const res = await fetch(`${app.baseUrl}/api/records/lots/${lotId}/pdf?paper=${paper}`, { headers: { cookie: [...members.auditor.cookies].map(([k, v]) => `${k}=${v}`).join('; ') } });
        expect(res.status).toBe(200);
        expect(res.headers.get('content-type')).toBe('application/pdf');
        const bytes = Buffer.from(await res.arrayBuffer());
        expect(bytes.subarray(0, 5).toString()).toBe('%PDF-');
        const file = join(dir, `${paper}.pdf`);
        writeFileSync(file, bytes);
        if (process.env.RECORD_PDF_OUT) writeFileSync(join(process.env.RECORD_PDF_OUT, `record-${paper}.pdf`), bytes);
        const text = execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
        const info = execFileSync('pdfinfo', [file], { encoding: 'utf8' });
        const fonts = execFileSync('pdffonts', [file], { encoding: 'utf8' });
        const record = await getRecord(members.auditor, lotId);
        for (const serial of [...w.preSerials, ...w.memSerials]) expect(text).toContain(serial);
        expect(text).toContain(word);
        const pages = Number(/Pages:\s+(\d+)/.exec(info)![1]);
        expect(pages).toBeGreaterThanOrEqual(2);
        // The fingerprint on every page.
        expect(text.split(record.fingerprint).length - 1).toBe(pages);
        expect(text).toContain('ΔP');
        expect(info).toMatch(paper === 'a4' ? /595\.28 x 841\.89 pts/ : /612 x 792 pts/);
        expect(fonts).toMatch(/SourceSans3/);
        expect(fonts).not.toMatch(/Helvetica/);
        if (word === 'FAIL') expect(text).toMatch(/Warning: .*failed its integrity test after the run/);
      }
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe('the whole-winery export carries each record’s fingerprint', () => {
  it('manifest.json lists the bottled lot with the same fingerprint as its record', async () => {
    const record = (await owner.get(`/api/records/lots/${bottled.lotId}`)).body as FilterRecordDto;
    const res = await fetch(`${app.baseUrl}/api/export/winery`, { headers: { cookie: [...owner.cookies].map(([k, v]) => `${k}=${v}`).join('; ') } });
    expect(res.status).toBe(200);
    const dir = mkdtempSync(join(process.env.TMPDIR ?? '/tmp', 'porewise-manifest-'));
    try {
      const zip = join(dir, 'export.zip');
      writeFileSync(zip, Buffer.from(await res.arrayBuffer()));
      const manifest = JSON.parse(execFileSync('unzip', ['-p', zip, 'manifest.json'], { encoding: 'utf8' })) as { records: { lotId: string; fingerprint: string }[] };
      expect(manifest.records.find((r) => r.lotId === bottled.lotId)?.fingerprint).toBe(record.fingerprint);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe('a corrected reading changes the record and its fingerprint, and keeps the original', () => {
  it('correcting a reading: new fingerprint, the old one no longer verifies, the record shows both values', async () => {
    const other = await createBottledLot(owner, { world });
    const before = (await owner.get(`/api/records/lots/${other.lotId}`)).body as FilterRecordDto;
    const run = (await owner.get(`/api/runs/${other.runId}`)).body as { stages: { readings: { id: string; volumeL: number; upstreamBar: number; downstreamBar: number }[] }[] };
    const first = run.stages[0].readings[0];
    const corrected = await owner.post(`/api/runs/${other.runId}/readings/${first.id}/correct`, {
      volumeL: first.volumeL,
      upstreamBar: first.upstreamBar + 0.05,
      downstreamBar: first.downstreamBar,
      reason: 'Gauge read from the wrong housing.',
    });
    expect(corrected.status).toBeLessThan(300);
    const after = (await owner.get(`/api/records/lots/${other.lotId}`)).body as FilterRecordDto;
    expect(after.fingerprint).not.toBe(before.fingerprint);
    expect((await owner.post('/api/records/verify', { lotId: other.lotId, fingerprint: before.fingerprint })).body.matches).toBe(false);
    expect((await owner.post('/api/records/verify', { lotId: other.lotId, fingerprint: after.fingerprint })).body.matches).toBe(true);
    expect(JSON.stringify(after)).toContain('Gauge read from the wrong housing.');
  });
});
