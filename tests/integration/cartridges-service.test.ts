// @vitest-environment node
// The cartridges service on its own, against the real test database: the routes' tests cover HTTP,
// roles and input; these call the service as another module (or a job) would, with a tenant.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { cartridgeMovesIn, createCartridgesService } from '../../server/modules/cartridges/cartridges.service';
import type { TenantContext } from '../../server/middleware/authorize';
import { cartridgeListQuerySchema, createCartridgeInputSchema } from '../../shared/schemas/cartridges';
import { deliveryCsv, insertCartridgeType, insertHousing, serialPrefix } from '../factories/cartridges';
import { ownerTenant } from '../support/api-app';
import { signUp, startTestApp, type TestApp } from '../support/test-app';

let app: TestApp;
let tenant: TenantContext;
let otherTenant: TenantContext;
let service: ReturnType<typeof createCartridgesService>;
let membrane: { id: string; name: string };
let housing: { id: string; name: string };
let shortHousing: { id: string; name: string };
let otherHousing: { id: string; name: string };

beforeAll(async () => {
  app = await startTestApp();
  tenant = ownerTenant((await signUp(app.baseUrl, { wineryName: 'Cartridges Service Winery', name: 'Tomas Lind' })).me);
  otherTenant = ownerTenant((await signUp(app.baseUrl, { wineryName: 'Other Cartridges Service Winery' })).me);
  membrane = await insertCartridgeType(app.db, tenant.wineryId, { name: 'PES 0.45 service test' });
  housing = await insertHousing(app.db, tenant.wineryId, { name: 'Service housing 2x30', rounds: 2, lengthIn: 30 });
  shortHousing = await insertHousing(app.db, tenant.wineryId, { name: 'Service housing 1x10', rounds: 1, lengthIn: 10 });
  otherHousing = await insertHousing(app.db, otherTenant.wineryId, { name: 'Other winery housing', rounds: 3, lengthIn: 30 });
  service = createCartridgesService(app.db);
});
afterAll(async () => {
  await app.close();
});

const prefix = serialPrefix();
let seq = 0;
const nextSerial = () => `${prefix}-S${String(++seq).padStart(3, '0')}`;
const register = (over: Record<string, unknown> = {}) =>
  service.register(tenant, createCartridgeInputSchema.parse({ serial: nextSerial(), batch: 'B24-200', typeId: membrane.id, lengthIn: 30, receivedAt: '2024-11-05', ...over }));

describe('cartridges service', () => {
  it('registers into stock and lists it; a serial used twice in the winery is 409', async () => {
    const c = await register();
    expect(c).toMatchObject({ status: 'in-stock', typeId: membrane.id, lengthIn: 30, housingId: null, elementEquivalents: 3 });
    const list = await service.list(tenant, cartridgeListQuerySchema.parse({ pageSize: 100, typeId: membrane.id }));
    expect(list.items.map((x) => x.id)).toContain(c.id);
    await expect(register({ serial: c.serial })).rejects.toMatchObject({ status: 409 });
  });

  it('changes one field and leaves the others', async () => {
    const c = await register({ notes: 'From the spring order' });
    const updated = await service.update(tenant, c.id, { batch: 'B25-001' });
    expect(updated).toMatchObject({ batch: 'B25-001', serial: c.serial, status: 'in-stock' });
    expect((await service.detail(tenant, c.id)).batch).toBe('B25-001');
  });

  it('installs into free rounds, refuses a full housing and a wrong length, and removes back to stock with the history kept', async () => {
    const a = await register();
    const b = await register();
    const extra = await register();
    expect(await service.install(tenant, a.id, { housingId: housing.id })).toMatchObject({ status: 'installed', housingId: housing.id, position: 1 });
    expect(await service.install(tenant, b.id, { housingId: housing.id })).toMatchObject({ position: 2 });
    await expect(service.install(tenant, extra.id, { housingId: housing.id })).rejects.toMatchObject({ status: 409, code: 'housing_full' });
    await expect(service.install(tenant, extra.id, { housingId: shortHousing.id })).rejects.toMatchObject({ status: 409, code: 'length_mismatch' });
    const removed = await service.remove(tenant, a.id);
    expect(removed).toMatchObject({ status: 'in-stock', housingId: null, position: null });
    const kinds = (await service.detail(tenant, a.id)).events.map((e) => e.kind);
    expect(kinds).toEqual(expect.arrayContaining(['installed', 'removed']));
    await service.remove(tenant, b.id);
  });

  it('a retired cartridge stays retired; one never used can be deleted, an installed one cannot', async () => {
    const r = await register();
    expect(await service.retire(tenant, r.id, { reason: 'Failed the bubble point twice' })).toMatchObject({ status: 'retired' });
    await expect(service.install(tenant, r.id, { housingId: housing.id })).rejects.toMatchObject({ status: 409, code: 'retired' });

    const unused = await register();
    await service.deleteUnused(tenant, unused.id);
    await expect(service.detail(tenant, unused.id)).rejects.toMatchObject({ status: 404 });

    const installed = await register();
    await service.install(tenant, installed.id, { housingId: housing.id });
    await expect(service.deleteUnused(tenant, installed.id)).rejects.toMatchObject({ status: 409 });
    await service.remove(tenant, installed.id);
  });

  it('another winery sees none of it (404), nor may a cartridge go into its housing', async () => {
    const c = await register();
    await expect(service.detail(otherTenant, c.id)).rejects.toMatchObject({ status: 404 });
    await expect(service.update(otherTenant, c.id, { notes: 'x' })).rejects.toMatchObject({ status: 404 });
    await expect(service.install(tenant, c.id, { housingId: otherHousing.id })).rejects.toMatchObject({ status: 404 });
    const list = await service.list(otherTenant, cartridgeListQuerySchema.parse({ pageSize: 100 }));
    expect(list.items.map((x) => x.id)).not.toContain(c.id);
  });

  it('previews a delivery file without saving, then imports it', async () => {
    const serials = [nextSerial(), nextSerial()];
    const csv = deliveryCsv(serials.map((s) => [s, 'B25-010', membrane.name, 30, '2025-01-15']));
    const preview = await service.previewImport(tenant, csv);
    expect(preview).toMatchObject({ valid: true, errorCount: 0, fileErrors: [] });
    expect(preview.rows).toHaveLength(2);
    const before = await service.list(tenant, cartridgeListQuerySchema.parse({ pageSize: 100, batch: 'B25-010' }));
    expect(before.total).toBe(0);
    const result = await service.importDelivery(tenant, csv);
    expect(result.imported).toBe(2);
    const after = await service.list(tenant, cartridgeListQuerySchema.parse({ pageSize: 100, batch: 'B25-010' }));
    expect(after.items.map((x) => x.serial).sort()).toEqual([...serials].sort());
  });

  it('gives other modules its moves inside their transaction (cartridgeMovesIn)', async () => {
    const c = await register();
    await app.db.transaction(async (tx) => {
      const moves = cartridgeMovesIn(tx, tenant);
      const locked = await moves.lock(c.id);
      expect(locked?.status).toBe('in-stock');
      await moves.install(locked!, { housingId: housing.id });
    });
    expect((await service.detail(tenant, c.id)).status).toBe('installed');
    await app.db.transaction(async (tx) => {
      const moves = cartridgeMovesIn(tx, otherTenant);
      expect(await moves.lock(c.id)).toBeNull();
    });
    await service.remove(tenant, c.id);
  });
});
