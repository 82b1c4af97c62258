// @vitest-environment node
import { mkdtempSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startFakeS3, type FakeS3 } from '../../server/lib/fake-services';
import { createS3Storage, type Storage } from '../../server/lib/storage';

let fake: FakeS3;
let storage: Storage;
let dir: string;

beforeAll(async () => {
  dir = mkdtempSync(join(process.env.TMPDIR ?? '/tmp', 'porewise-s3-'));
  fake = await startFakeS3({ directory: dir });
  storage = createS3Storage({ endpoint: fake.endpoint, region: 'us-east-1', bucket: 'porewise-test', accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' });
  await storage.ensureBucket();
});
afterAll(async () => {
  await fake?.close();
  rmSync(dir, { recursive: true, force: true });
});

describe('object storage through the S3 client', () => {
  it('puts and gets an object byte for byte', async () => {
    const body = new Uint8Array(70_000).map((_, i) => (i * 31) % 256);
    await storage.put('wineries/w1/lab-report.pdf', body, 'application/pdf');
    const got = await storage.get('wineries/w1/lab-report.pdf');
    expect(got.contentType).toBe('application/pdf');
    expect(Buffer.from(got.body).equals(Buffer.from(body))).toBe(true);
  });

  it('creating the bucket twice is harmless', async () => {
    await expect(storage.ensureBucket()).resolves.toBeUndefined();
  });

  it('removes an object', async () => {
    await storage.put('tmp/x.txt', new TextEncoder().encode('x'), 'text/plain');
    await storage.remove('tmp/x.txt');
    await expect(storage.get('tmp/x.txt')).rejects.toThrow();
  });
});
