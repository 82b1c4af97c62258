// @vitest-environment node
// Flow recovery with the ΔP the clean-water flow was measured at: a flow measured at another ΔP
// than the type's specification is brought to it before the recovery is judged.
// Source: Darcy's law for laminar flow through a porous medium, Q = k·A·ΔP/(μ·L) — at one
// temperature the flow is proportional to ΔP, so a flow Q measured at ΔP₁ is Q·ΔP_ref/ΔP₁ at ΔP_ref.
import { and, eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { cartridgeEventsTable } from '../../server/db/schema';
import { insertCartridgeType, serialPrefix } from '../factories/cartridges';
import { setupApiApp } from '../support/api-app';
import type { Client } from '../support/test-app';

const app = setupApiApp({ wineryName: 'Reference Pressure Winery', otherWineryName: 'Other Pressure Winery' });
let owner: Client;
let other: Client;
let typeId: string;
const prefix = serialPrefix();
let seq = 0;

async function registered(client: Client) {
  const res = await client.post('/api/cartridges', { serial: `${prefix}-${String(++seq).padStart(3, '0')}`, batch: 'B1', typeId, lengthIn: 30, receivedAt: '2024-11-05' });
  expect(res.status).toBe(201);
  return res.body as { id: string; serial: string };
}

beforeAll(async () => {
  ({ owner, other } = app);
  // 1,200 L/h per 10-inch at 0.1 bar and 20 °C: a 30-inch cartridge passes 3,600 L/h when clean.
  typeId = (await insertCartridgeType(app.db, app.wineryId, { name: `PES dp ${prefix}`, waterFlowLhPer10in: 1200, waterDpBar: 0.1, flowRecoveryMinPct: 70 })).id;
});

describe('a flow-recovery measurement at its own ΔP', () => {
  it('the care form’s target gives the type’s specification ΔP as the default', async () => {
    const c = await registered(owner);
    const res = await owner.get(`/api/care/cartridges/${c.id}`);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ waterDpBar: 0.1, flowBasis: { kind: 'spec', flowLh: 3600 } });
  });

  it('1,800 L/h at 0.05 bar is 3,600 L/h at the 0.1 bar reference: 100 % recovery, and the ΔP is kept with the record', async () => {
    const c = await registered(owner);
    const res = await owner.post(`/api/cartridges/${c.id}/cycles`, { kind: 'hot-water', tempC: 80, durationMin: 20, waterFlowAfterLh: 1800, waterTempC: 20, flowDpBar: 0.05 });
    expect(res.status).toBe(201);
    expect(res.body.event.details).toMatchObject({ waterFlowAfterLh: 1800, flowDpBar: 0.05 });
    expect(res.body.life.recovery.latestPct).toBeCloseTo(100, 6);
    expect(res.body.life.recovery.points[0].waterFlowAfterLh).toBeCloseTo(3600, 6);
  });

  it('left out, the type’s specification ΔP is assumed and stored: the same 1,800 L/h is 50 %', async () => {
    const c = await registered(owner);
    const res = await owner.post(`/api/cartridges/${c.id}/cycles`, { kind: 'hot-water', tempC: 80, durationMin: 20, waterFlowAfterLh: 1800, waterTempC: 20 });
    expect(res.status).toBe(201);
    expect(res.body.event.details.flowDpBar).toBe(0.1);
    expect(res.body.life.recovery.latestPct).toBeCloseTo(50, 6);
    // A cycle without a flow carries no ΔP.
    const plain = await owner.post(`/api/cartridges/${c.id}/cycles`, { kind: 'backflush' });
    expect(plain.status).toBe(201);
    const [row] = await app.db.select().from(cartridgeEventsTable).where(and(eq(cartridgeEventsTable.cartridgeId, c.id), eq(cartridgeEventsTable.id, plain.body.event.id)));
    expect(row.details).not.toHaveProperty('flowDpBar');
  });

  it('a ΔP of zero, below zero, too large or not a number is refused with a field message', async () => {
    const c = await registered(owner);
    for (const flowDpBar of [0, -0.1, 11, 'a lot']) {
      const res = await owner.post(`/api/cartridges/${c.id}/cycles`, { kind: 'hot-water', waterFlowAfterLh: 1800, flowDpBar });
      expect(res.status).toBe(400);
      expect(res.body.error.fields.flowDpBar).toMatch(/ΔP of the flow measurement/);
    }
  });

  it('another winery gets 404', async () => {
    const c = await registered(owner);
    expect((await other.post(`/api/cartridges/${c.id}/cycles`, { kind: 'hot-water', waterFlowAfterLh: 1800, flowDpBar: 0.05 })).status).toBe(404);
  });
});
