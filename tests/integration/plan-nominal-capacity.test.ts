// @vitest-environment node
// The cartridge type's nominal capacity (issue: plans you can approve with confidence): the last
// source of a stage's capacity per m², after a typed figure, the lot's Vmax test and the winery's
// past runs. Stored on the type through the equipment API, checked at the boundary (400 with the
// field's message), and named on the plan's stage. Common practice, no source: capacity × area.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { PlanDto } from '../../shared/types/plans';
import type { CartridgeTypeDto } from '../../shared/types/equipment';
import { addPlanLot, addTrain, createPlan, createPlanWorld, trainBody, type PlanWorld } from '../factories/plans';
import { cartridgeTypeInput } from '../factories/equipment';
import { signUp, startTestApp, type Client, type TestApp } from '../support/test-app';

let app: TestApp;
let owner: Client;
let world: PlanWorld;

// The world's housings hold 3 × 30-inch: 9 ten-inch equivalents; prefilter 0.45 m², membrane
// 0.7 m² per 10-inch (tests/factories/plans.ts, equipment.ts).
const PRE_M2 = 9 * 0.45;
const MEM_M2 = 9 * 0.7;

beforeAll(async () => {
  app = await startTestApp();
  owner = (await signUp(app.baseUrl, { wineryName: 'Nominal Capacity Winery' })).client;
  world = await createPlanWorld(owner);
}, 120_000);
afterAll(async () => {
  await app?.close();
});

async function planWithoutTypedCapacity(): Promise<PlanDto> {
  const plan = await createPlan(owner, world.lineId);
  const planLotId = (await addPlanLot(owner, plan.id, world.lotId, 6000)).lots[0].id;
  const body = trainBody(world);
  for (const s of body.stages) delete (s as { capacityLPerM2?: number }).capacityLPerM2;
  return addTrain(owner, plan.id, planLotId, body);
}

describe('the cartridge type’s nominal capacity', () => {
  it('is stored, shown and cleared through the equipment API', async () => {
    const created = await owner.post('/api/cartridge-types', cartridgeTypeInput({ nominalCapacityLPerM2: 1100 }));
    expect(created.status).toBe(201);
    expect((created.body as CartridgeTypeDto).nominalCapacityLPerM2).toBe(1100);
    const plain = await owner.post('/api/cartridge-types', cartridgeTypeInput());
    expect((plain.body as CartridgeTypeDto).nominalCapacityLPerM2).toBeNull();
    const id = (created.body as CartridgeTypeDto).id;
    const cleared = await owner.patch(`/api/cartridge-types/${id}`, { nominalCapacityLPerM2: null });
    expect(cleared.status).toBe(200);
    expect((cleared.body as CartridgeTypeDto).nominalCapacityLPerM2).toBeNull();
    expect(((await owner.get(`/api/cartridge-types/${id}`)).body as CartridgeTypeDto).nominalCapacityLPerM2).toBeNull();
  });

  it('refuses a negative, zero, absurd or non-numeric nominal with 400 and the field’s message', async () => {
    for (const bad of [-500, 0, 5_000_000, 'lots']) {
      const res = await owner.post('/api/cartridge-types', cartridgeTypeInput({ nominalCapacityLPerM2: bad }));
      expect(res.status).toBe(400);
      expect(Object.keys(res.body.error.fields)).toEqual(['nominalCapacityLPerM2']);
      expect(res.body.error.fields.nominalCapacityLPerM2).toMatch(/nominal capacity/);
    }
    const patch = await owner.patch(`/api/cartridge-types/${world.membraneTypeId}`, { nominalCapacityLPerM2: -1 });
    expect(patch.status).toBe(400);
    expect(patch.body.error.fields.nominalCapacityLPerM2).toMatch(/more than 0/);
  });

  it('sizes a stage with no typed capacity, no Vmax test and no past runs from the type’s nominal, and names it', async () => {
    const before = (await planWithoutTypedCapacity()).lots[0].trains[0].sizing!.stages;
    expect(before.map((s) => s.capacitySource)).toEqual([null, null]);

    expect((await owner.patch(`/api/cartridge-types/${world.prefilterTypeId}`, { nominalCapacityLPerM2: 2500 })).status).toBe(200);
    expect((await owner.patch(`/api/cartridge-types/${world.membraneTypeId}`, { nominalCapacityLPerM2: 900 })).status).toBe(200);
    const detail = await planWithoutTypedCapacity();
    const [pre, mem] = detail.lots[0].trains[0].sizing!.stages;
    expect(detail.lots[0].lot.pastRuns).toEqual([]);
    expect([pre.capacitySource, pre.capacityLPerM2]).toEqual(['nominal', 2500]);
    expect([mem.capacitySource, mem.capacityLPerM2]).toEqual(['nominal', 900]);
    expect(pre.capacityL).toBeCloseTo(2500 * PRE_M2, 6);
    expect(mem.capacityL).toBeCloseTo(900 * MEM_M2, 6);
    // 6,000 L over 5,670 L of membrane: two loads.
    expect(mem.loadsNeeded).toBe(2);

    // A typed figure still wins over the nominal.
    const plan = await createPlan(owner, world.lineId);
    const planLotId = (await addPlanLot(owner, plan.id, world.lotId, 6000)).lots[0].id;
    const typed = await addTrain(owner, plan.id, planLotId, trainBody(world));
    expect(typed.lots[0].trains[0].sizing!.stages.map((s) => [s.capacitySource, s.capacityLPerM2])).toEqual([
      ['stage', 3000],
      ['stage', 2000],
    ]);
  });

  it('another winery can neither read nor change the type’s nominal (404)', async () => {
    const other = (await signUp(app.baseUrl, { wineryName: 'Other Nominal Winery' })).client;
    expect((await other.get(`/api/cartridge-types/${world.membraneTypeId}`)).status).toBe(404);
    expect((await other.patch(`/api/cartridge-types/${world.membraneTypeId}`, { nominalCapacityLPerM2: 5 })).status).toBe(404);
    expect(((await owner.get(`/api/cartridge-types/${world.membraneTypeId}`)).body as CartridgeTypeDto).nominalCapacityLPerM2).toBe(900);
  });
});
