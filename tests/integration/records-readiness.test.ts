// @vitest-environment node
// The record's "Readiness at start" is kept when the run starts: a threshold changed in
// Settings later never rewrites it (nor the fingerprint). Runs from before it was kept are
// judged with the current thresholds and the record says so.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { defaultReadinessThresholds } from '../../shared/engine';
import type { FilterRecordDto } from '../../shared/types/records';
import { runsTable } from '../../server/db/schema';
import { createBottledLot } from '../factories/records';
import { signUp, startTestApp, type Client, type TestApp } from '../support/test-app';

let app: TestApp;
let owner: Client;

beforeAll(async () => {
  app = await startTestApp();
  owner = (await signUp(app.baseUrl, { name: 'Runa Owner', wineryName: 'Frozen Readiness Winery' })).client;
}, 120_000);
afterAll(async () => {
  await app?.close();
});

const record = async (lotId: string) => {
  const res = await owner.get(`/api/records/lots/${lotId}`);
  expect(res.status).toBe(200);
  return res.body as FilterRecordDto;
};

/** The run rows of the record's CSV, by column name. */
async function csvRuns(lotId: string) {
  const res = await owner.get(`/api/records/lots/${lotId}/csv`);
  expect(res.status).toBe(200);
  const rows = Papa.parse<string[]>(res.text, { skipEmptyLines: true }).data;
  const header = rows.find((r) => r[0] === 'run columns')!;
  return rows.filter((r) => r[0] === 'run').map((r) => Object.fromEntries(header.slice(1).map((h, i) => [h, r[i + 1]])));
}

async function pdfText(lotId: string) {
  const res = await fetch(`${app.baseUrl}/api/records/lots/${lotId}/pdf?paper=a4`, { headers: { cookie: [...owner.cookies].map(([k, v]) => `${k}=${v}`).join('; ') } });
  expect(res.status).toBe(200);
  const dir = mkdtempSync(join(process.env.TMPDIR ?? '/tmp', 'porewise-readiness-'));
  try {
    const file = join(dir, 'record.pdf');
    writeFileSync(file, Buffer.from(await res.arrayBuffer()));
    // pdftotext (poppler-utils) without -layout keeps a sentence on one line or across a few
    return execFileSync('pdftotext', [file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

const stricter = () => {
  const own = structuredClone(defaultReadinessThresholds);
  // the lot's 0.6 NTU was ready under 1.0 NTU; under 0.4 NTU (+0.1 borderline) it is not ready
  own.turbidity.white.limitNtu = 0.4;
  own.turbidity.white.borderlineMarginNtu = 0.1;
  return own;
};

describe('readiness at the start of a run is kept with the run', () => {
  it('a threshold changed after the start leaves the record’s readiness, thresholds and fingerprint as they were (JSON, CSV, PDF)', async () => {
    const bottled = await createBottledLot(owner, { lot: { style: 'white' } });
    const before = await record(bottled.lotId);
    const run = before.runs[0];
    expect(run.readiness).toMatchObject({ verdict: 'ready', source: 'frozen-at-start', note: null });
    expect(run.readiness.thresholds).toMatchObject({ isDefault: true, turbidity: { limitNtu: 1.0, borderlineMarginNtu: 0.5 }, cloggingIndex: { readyMaxS: 20, borderlineMaxS: 50 } });
    expect(run.analyses).toMatchObject({ turbidityNtu: 0.6, cloggingIndex: 10 });
    // kept on the run row itself
    const [row] = await app.db.select().from(runsTable).where(eq(runsTable.id, bottled.runId));
    expect(row.readinessAtStart).toMatchObject({ verdict: 'ready', thresholds: { isDefault: true } });

    const put = await owner.put('/api/settings/winery', { readinessThresholds: stricter() });
    expect(put.status).toBe(200);
    // the change bites on the lot today …
    const lot = (await owner.get(`/api/lots/${bottled.lotId}`)).body as { readiness: { verdict: string } };
    expect(lot.readiness.verdict).toBe('not-ready');
    // … but not on the record of the run that started before it
    const after = await record(bottled.lotId);
    expect(after.runs[0].readiness).toEqual(run.readiness);
    expect(after.runs[0].analyses).toEqual(run.analyses);
    expect(after.fingerprint).toBe(before.fingerprint);
    expect((await owner.post('/api/records/verify', { lotId: bottled.lotId, fingerprint: before.fingerprint })).body).toEqual({ matches: true });

    const [csv] = await csvRuns(bottled.lotId);
    expect(csv).toMatchObject({ readiness: 'ready', readiness_source: 'frozen-at-start', readiness_thresholds_default: 'true', readiness_turbidity_limit_ntu: '1', readiness_note: '' });
    const text = await pdfText(bottled.lotId);
    expect(text).toContain('Readiness at start');
    expect(text).toMatch(/Porewise defaults, as in force when the run started: turbidity ready up to 1\.0 NTU/);

    // a run started now keeps the stricter thresholds, and says they are the winery's own
    const later = await createBottledLot(owner, { lot: { style: 'white' } });
    const laterRun = (await record(later.lotId)).runs[0];
    expect(laterRun.readiness).toMatchObject({ verdict: 'not-ready', source: 'frozen-at-start', thresholds: { isDefault: false, turbidity: { limitNtu: 0.4 } } });
    expect(laterRun.readiness.reasons.join(' ')).toMatch(/NTU/);

    // restoring the defaults rewrites neither record
    expect((await owner.put('/api/settings/winery', { readinessThresholds: null })).status).toBe(200);
    expect((await record(bottled.lotId)).fingerprint).toBe(before.fingerprint);
    expect((await record(later.lotId)).runs[0].readiness).toEqual(laterRun.readiness);
  });

  it('a run from before readiness was kept: judged with the current thresholds, and the record says so in every format', async () => {
    const bottled = await createBottledLot(owner, { lot: { style: 'white' } });
    // as a run started before this change was stored
    await app.db.update(runsTable).set({ readinessAtStart: null }).where(eq(runsTable.id, bottled.runId));
    const first = await record(bottled.lotId);
    expect(first.runs[0].readiness).toMatchObject({ verdict: 'ready', source: 'current-thresholds', thresholds: { isDefault: true } });
    expect(first.runs[0].readiness.note).toMatch(/current readiness thresholds/);
    expect(first.runs[0].analyses).toMatchObject({ turbidityNtu: 0.6 });
    const [csv] = await csvRuns(bottled.lotId);
    expect(csv.readiness_source).toBe('current-thresholds');
    expect(csv.readiness_note).toMatch(/current readiness thresholds/);
    const text = await pdfText(bottled.lotId);
    expect(text).toContain('Computed with the winery’s current readiness thresholds');
    expect(text).toContain('as they are now');

    // today's behaviour, named as such: the current thresholds judge it
    expect((await owner.put('/api/settings/winery', { readinessThresholds: stricter() })).status).toBe(200);
    const second = await record(bottled.lotId);
    expect(second.runs[0].readiness).toMatchObject({ verdict: 'not-ready', source: 'current-thresholds', thresholds: { isDefault: false } });
    expect(second.fingerprint).not.toBe(first.fingerprint);
    expect((await owner.put('/api/settings/winery', { readinessThresholds: null })).status).toBe(200);
  });
});
