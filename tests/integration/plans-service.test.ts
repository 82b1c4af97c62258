// @vitest-environment node
// The plans service on its own, against the real test database: the routes' tests cover HTTP,
// roles and input; these call the service as another module (or a job) would, with a tenant.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createPlansService, planCatalogue } from '../../server/modules/plans/plans.service';
import type { TenantContext } from '../../server/middleware/authorize';
import { addPlanLotInputSchema, createPlanInputSchema, createTrainInputSchema, planListQuerySchema } from '../../shared/schemas/plans';
import { createPlanWorld, planBody, stockPlanWorld, trainBody, type PlanWorld } from '../factories/plans';
import { ownerTenant } from '../support/api-app';
import { signUp, startTestApp, type TestApp } from '../support/test-app';

let app: TestApp;
let world: PlanWorld;
let tenant: TenantContext;
let otherTenant: TenantContext;
let service: ReturnType<typeof createPlansService>;

beforeAll(async () => {
  app = await startTestApp();
  const a = await signUp(app.baseUrl, { wineryName: 'Plans Service Winery', name: 'Ines Okafor' });
  tenant = ownerTenant(a.me);
  otherTenant = ownerTenant((await signUp(app.baseUrl, { wineryName: 'Other Plans Service Winery' })).me);
  world = await createPlanWorld(a.client);
  await stockPlanWorld(a.client, world);
  service = createPlansService(app.db);
});
afterAll(async () => {
  await app.close();
});

const newPlan = (over: Record<string, unknown> = {}) => service.create(tenant, createPlanInputSchema.parse(planBody(world.lineId, over)));

describe('plans service', () => {
  it('creates a draft on the line, lists it, and changes one field of it', async () => {
    const plan = await newPlan({ plannedDate: '2025-07-01' });
    expect(plan).toMatchObject({ status: 'draft', plannedDate: '2025-07-01', line: { id: world.lineId }, lots: [], createdBy: 'Ines Okafor' });
    expect(plan.requiredFlowLh).toBeGreaterThan(0);
    const list = await service.list(tenant, planListQuerySchema.parse({ pageSize: 100 }));
    expect(list.items.map((p) => p.id)).toContain(plan.id);
    const renamed = await service.update(tenant, plan.id, { name: `${plan.name} (moved)` });
    expect(renamed).toMatchObject({ name: `${plan.name} (moved)`, plannedDate: '2025-07-01', startTime: plan.startTime });
  });

  it('another winery cannot read or change the plan (404)', async () => {
    const plan = await newPlan();
    await expect(service.get(otherTenant, plan.id)).rejects.toMatchObject({ status: 404 });
    await expect(service.update(otherTenant, plan.id, { name: 'Taken' })).rejects.toMatchObject({ status: 404 });
    await expect(service.remove(otherTenant, plan.id)).rejects.toMatchObject({ status: 404 });
    expect((await service.get(tenant, plan.id)).name).toBe(plan.name);
  });

  it('adds a lot and a train: the engine sizes it; the same lot twice is 409 on lotId', async () => {
    const plan = await newPlan();
    const withLot = await service.addLot(tenant, plan.id, addPlanLotInputSchema.parse({ lotId: world.lotId }));
    expect(withLot.lots).toHaveLength(1);
    const planLotId = withLot.lots[0].id;
    const withTrain = await service.addTrain(tenant, plan.id, planLotId, createTrainInputSchema.parse(trainBody(world)));
    const train = withTrain.lots[0].trains[0];
    expect(train.sizingError).toBeNull();
    expect(train.sizing).not.toBeNull();
    const chosen = await service.updateLot(tenant, plan.id, planLotId, { chosenTrainId: train.id });
    expect(chosen.lots[0].chosenTrainId).toBe(train.id);
    await expect(service.addLot(tenant, plan.id, { lotId: world.lotId })).rejects.toMatchObject({ status: 409, code: 'lot_already_planned', fields: { lotId: expect.any(String) } });
  });

  it('approves a plan that can be sized; approved plans are not deleted, drafts are', async () => {
    const plan = await newPlan();
    const withLot = await service.addLot(tenant, plan.id, { lotId: world.secondLotId });
    const withTrain = await service.addTrain(tenant, plan.id, withLot.lots[0].id, createTrainInputSchema.parse(trainBody(world)));
    await service.updateLot(tenant, plan.id, withLot.lots[0].id, { chosenTrainId: withTrain.lots[0].trains[0].id });
    const approved = await service.approve(tenant, plan.id, { reason: 'Checked on the cellar floor.' });
    expect(approved.status).toBe('approved');
    expect(approved.approvedBy).toBe('Ines Okafor');
    await expect(service.remove(tenant, plan.id)).rejects.toMatchObject({ status: 409 });

    const draft = await newPlan();
    await service.remove(tenant, draft.id);
    await expect(service.get(tenant, draft.id)).rejects.toMatchObject({ status: 404 });
  });

  it('refuses to approve a train that breaks a housing rating (409 plan_not_ready)', async () => {
    const plan = await newPlan();
    const withLot = await service.addLot(tenant, plan.id, { lotId: world.lotId });
    const weak = trainBody(world, {
      stages: [{ name: 'Membrane', cartridgeTypeId: world.membraneTypeId, housingId: world.weakHousingId, housingCount: 1, capacityLPerM2: 2000 }],
    });
    const withTrain = await service.addTrain(tenant, plan.id, withLot.lots[0].id, createTrainInputSchema.parse(weak));
    await service.updateLot(tenant, plan.id, withLot.lots[0].id, { chosenTrainId: withTrain.lots[0].trains[0].id });
    await expect(service.approve(tenant, plan.id, { reason: 'Anyway' })).rejects.toMatchObject({ status: 409, code: 'plan_not_ready' });
    expect((await service.get(tenant, plan.id)).status).toBe('draft');
  });

  it('shares its catalogue with other modules through planCatalogue', async () => {
    const catalogue = planCatalogue(app.db);
    const types = await catalogue.types(tenant.wineryId);
    const housings = await catalogue.housings(tenant.wineryId);
    expect(types.map((t) => t.id)).toEqual(expect.arrayContaining([world.prefilterTypeId, world.membraneTypeId]));
    expect(housings.map((h) => h.id)).toEqual(expect.arrayContaining([world.prefilterHousingId, world.membraneHousingId]));
    expect(await catalogue.types(otherTenant.wineryId)).toEqual([]);
  });
});
