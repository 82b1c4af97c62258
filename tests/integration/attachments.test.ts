// @vitest-environment node
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { lotsTable } from '../../server/db/schema';
import { addMember, signUp, startTestApp, type Client, type TestApp } from '../support/test-app';

let app: TestApp;
let owner: Client;
let lotId: string;

const pdf = new TextEncoder().encode('%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\n%%EOF\n');
const png = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 73, 72, 68, 82]);

async function upload(client: Client, fields: Record<string, string>, file?: { name: string; bytes: Uint8Array; type?: string }) {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  if (file) form.set('file', new Blob([file.bytes.slice()], { type: file.type ?? 'application/octet-stream' }), file.name);
  const headers: Record<string, string> = { origin: client.baseUrl };
  if (client.cookies.size) headers.cookie = [...client.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  const res = await fetch(`${client.baseUrl}/api/attachments`, { method: 'POST', headers, body: form });
  return { status: res.status, body: await res.json().catch(() => null) };
}

async function insertLot(wineryId: string, code: string) {
  const [row] = await app.db
    .insert(lotsTable)
    .values({ wineryId, code, name: 'Test lot', style: 'white', volumeL: 5000, ethanolPctVol: 12.5, tempC: 14 })
    .returning({ id: lotsTable.id });
  return row.id;
}

beforeAll(async () => {
  app = await startTestApp({ withStorage: true });
  const signedUp = await signUp(app.baseUrl);
  owner = signedUp.client;
  lotId = await insertLot(signedUp.me.activeWineryId!, `L-${Date.now()}`);
});
afterAll(async () => {
  await app.close();
});

describe('attachments', () => {
  it('uploads a PDF to a lot, lists it and downloads it through the authorised route', async () => {
    const res = await upload(owner, { ownerKind: 'lot', ownerId: lotId }, { name: 'lab report 2026-11.pdf', bytes: pdf, type: 'application/pdf' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ fileName: 'lab report 2026-11.pdf', contentType: 'application/pdf', sizeBytes: pdf.byteLength });
    const list = await owner.get(`/api/attachments?ownerKind=lot&ownerId=${lotId}`);
    expect(list.body.items.map((a: { id: string }) => a.id)).toContain(res.body.id);
    const download = await owner.request('GET', res.body.downloadUrl);
    expect(download.status).toBe(200);
    expect(download.headers.get('content-type')).toBe('application/pdf');
    expect(download.headers.get('content-disposition')).toMatch(/attachment/);
    expect(download.text).toBe(new TextDecoder().decode(pdf));
  });

  it('checks the type by content, not by name', async () => {
    const renamed = await upload(owner, { ownerKind: 'lot', ownerId: lotId }, { name: 'photo.pdf', bytes: png });
    expect(renamed.status).toBe(400);
    expect(renamed.body.error.fields.file).toMatch(/PNG/);
    const exe = await upload(owner, { ownerKind: 'lot', ownerId: lotId }, { name: 'report.pdf', bytes: new Uint8Array([0x4d, 0x5a, 0x90, 0, 3, 0]) });
    expect(exe.status).toBe(400);
    const okPng = await upload(owner, { ownerKind: 'lot', ownerId: lotId }, { name: 'sample.png', bytes: png });
    expect(okPng.status).toBe(201);
  });

  it('refuses files over 10 MB with 413', async () => {
    const big = new Uint8Array(10 * 1024 * 1024 + 10);
    big.set(pdf);
    const res = await upload(owner, { ownerKind: 'lot', ownerId: lotId }, { name: 'big.pdf', bytes: big });
    expect(res.status).toBe(413);
  });

  it('asks for a file and a valid owner', async () => {
    expect((await upload(owner, { ownerKind: 'lot', ownerId: lotId })).status).toBe(400);
    const bad = await upload(owner, { ownerKind: 'tank-of-wine', ownerId: 'x' }, { name: 'a.pdf', bytes: pdf });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['ownerId', 'ownerKind']);
  });

  it('an auditor reads but may not upload or delete', async () => {
    const auditor = await addMember(app, owner, 'auditor');
    expect((await upload(auditor.client, { ownerKind: 'lot', ownerId: lotId }, { name: 'a.pdf', bytes: pdf })).status).toBe(403);
    const list = await auditor.client.get(`/api/attachments?ownerKind=lot&ownerId=${lotId}`);
    expect(list.status).toBe(200);
    expect((await auditor.client.delete(`/api/attachments/${list.body.items[0].id}`)).status).toBe(403);
    expect((await auditor.client.request('GET', list.body.items[0].downloadUrl)).status).toBe(200);
  });

  it('a technician may attach files and delete only the ones they attached', async () => {
    const tech = await addMember(app, owner, 'technician');
    const mine = await upload(tech.client, { ownerKind: 'lot', ownerId: lotId }, { name: 'b.pdf', bytes: pdf });
    expect(mine.status).toBe(201);
    expect(mine.body.uploadedById).toBe(tech.userId);
    const ownersFile = await upload(owner, { ownerKind: 'lot', ownerId: lotId }, { name: 'owners.pdf', bytes: pdf });
    expect((await tech.client.delete(`/api/attachments/${ownersFile.body.id}`)).status).toBe(403);
    expect((await tech.client.delete(`/api/attachments/${mine.body.id}`)).status).toBe(204);
  });

  it('another winery gets 404 for the file, its list and its owner record', async () => {
    const { client: other } = await signUp(app.baseUrl);
    const mine = await upload(owner, { ownerKind: 'lot', ownerId: lotId }, { name: 'c.pdf', bytes: pdf });
    expect((await other.request('GET', mine.body.downloadUrl)).status).toBe(404);
    expect((await other.delete(`/api/attachments/${mine.body.id}`)).status).toBe(404);
    expect((await other.get(`/api/attachments?ownerKind=lot&ownerId=${lotId}`)).status).toBe(404);
    expect((await upload(other, { ownerKind: 'lot', ownerId: lotId }, { name: 'd.pdf', bytes: pdf })).status).toBe(404);
    expect((await other.request('GET', '/api/attachments/not-a-uuid/download')).status).toBe(404);
  });

  it('the owner deletes an attachment', async () => {
    const res = await upload(owner, { ownerKind: 'lot', ownerId: lotId }, { name: 'e.pdf', bytes: pdf });
    expect((await owner.delete(`/api/attachments/${res.body.id}`)).status).toBe(204);
    expect((await owner.request('GET', res.body.downloadUrl)).status).toBe(404);
  });
});
