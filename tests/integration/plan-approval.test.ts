// @vitest-environment node
// Approval stops at broken limits (issue: plans you can approve with confidence): the same
// housing in two stages, sanitation hotter than a rating, a stage that cannot filter the wine;
// and cautions (flux above design, a lot not ready) pass only with a written reason.
import { describe, expect, it } from 'vitest';
import type { PlanDto } from '../../shared/types/plans';
import { createLabResult, createLot, discPoints } from '../factories/cellar';
import { createCartridgeType } from '../factories/equipment';
import { addPlanLot, addTrain, createPlan, createPlanWorld, stockPlanWorld, trainBody } from '../factories/plans';
import { setupApiApp } from '../support/api-app';
import { signUp, type Client } from '../support/test-app';

const app = setupApiApp({ wineryName: 'Approval Test Winery', world: 'stocked' });

/** A draft for one lot whose only train is chosen. */
async function chosenDraft(train: Record<string, unknown>, opts: { lotId?: string; sanitationKind?: 'hot-water' | 'steam'; client?: Client; lineId?: string } = {}) {
  const who = opts.client ?? app.owner;
  const plan = await createPlan(who, opts.lineId ?? app.world.lineId, opts.sanitationKind ? { sanitationKind: opts.sanitationKind } : {});
  const withLot = await addPlanLot(who, plan.id, opts.lotId ?? app.world.lotId);
  const planLotId = withLot.lots[0].id;
  const withTrain = await addTrain(who, plan.id, planLotId, train);
  const trainId = withTrain.lots[0].trains[0].id;
  const chosen = await who.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: trainId });
  expect(chosen.status).toBe(200);
  return { planId: plan.id, detail: chosen.body as PlanDto };
}

describe('approval refuses broken limits (409 plan_not_ready with the reasons)', () => {
  it('the same housing in two stages', async () => {
    const body = trainBody(app.world);
    body.stages[1].housingId = body.stages[0].housingId;
    const { planId, detail } = await chosenDraft(body);
    expect(detail.lots[0].trains[0].blockingReasons.join(' ')).toMatch(/same housing/);
    const res = await app.owner.post(`/api/plans/${planId}/approve`);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('plan_not_ready');
    expect(Object.values(res.body.error.fields).join(' ')).toMatch(/same housing as Prefilter/);
  });

  it('steam (121 °C, from memory) over cartridges rated 80 °C', async () => {
    const cool = await createCartridgeType(app.owner, { kind: 'prefilter', media: 'polypropylene', ratingUm: 1, maxTempC: 80, bubblePointMinBar: null, diffusionMaxMlMinPer10in: null, designFluxLhPer10in: 800 });
    const body = trainBody(app.world);
    body.stages[0].cartridgeTypeId = cool.id;
    const { planId } = await chosenDraft(body, { sanitationKind: 'steam' });
    const res = await app.owner.post(`/api/plans/${planId}/approve`);
    expect(res.status).toBe(409);
    expect(Object.values(res.body.error.fields).join(' ')).toMatch(/steam sanitation at 121 °C is above the cartridges' 80 °C rating/);
    // Hot water (82 °C) is also above 80 °C: still refused, never "no limit broken".
    const hot = await chosenDraft(body, { sanitationKind: 'hot-water' });
    expect((await app.owner.post(`/api/plans/${hot.planId}/approve`)).status).toBe(409);
  });

  it('a stage whose clean ΔP already reaches its terminal ΔP (cold wine, tight membrane)', async () => {
    const cold = await createLot(app.owner, { volumeL: 4000, tempC: 2, ethanolPctVol: 12.5, sugarGPerL: 2 });
    const tight = await createCartridgeType(app.owner, { waterFlowLhPer10in: 150, waterDpBar: 1, terminalDpBar: 1.2, maxDpForwardBar: 5 });
    const body = trainBody(app.world);
    body.stages[1].cartridgeTypeId = tight.id;
    const { planId, detail } = await chosenDraft(body, { lotId: cold.id });
    const stage = detail.lots[0].trains[0].sizing!.stages[1];
    expect(stage.infeasible).toBe(true);
    expect(stage.capacityL).toBe(0);
    expect(stage.loadsNeeded).toBeNull();
    const res = await app.owner.post(`/api/plans/${planId}/approve`);
    expect(res.status).toBe(409);
    expect(Object.values(res.body.error.fields).join(' ')).toMatch(/cannot filter it/);
  });
});

describe('approval with cautions needs a written reason, kept with the approval', () => {
  it('membrane flux above design: refused without a reason, approved with one, cleared on reopen', async () => {
    const busy = await createCartridgeType(app.owner, { designFluxLhPer10in: 200 });
    const body = trainBody(app.world);
    body.stages[1].cartridgeTypeId = busy.id;
    const { planId } = await chosenDraft(body);
    const bare = await app.owner.post(`/api/plans/${planId}/approve`);
    expect(bare.status).toBe(409);
    expect(bare.body.error.code).toBe('plan_needs_reason');
    expect(Object.values(bare.body.error.fields).join(' ')).toMatch(/above the design 200 L\/h/);
    expect((await app.owner.post(`/api/plans/${planId}/approve`, { reason: '   ' })).status).toBe(409);
    expect((await app.owner.post(`/api/plans/${planId}/approve`, { reason: 7 })).status).toBe(400);

    const ok = await app.owner.post(`/api/plans/${planId}/approve`, { reason: 'Short lot; the set is changed after it anyway.' });
    expect(ok.status).toBe(200);
    expect(ok.body.status).toBe('approved');
    expect(ok.body.approvalOverride.reason).toBe('Short lot; the set is changed after it anyway.');
    expect(ok.body.approvalOverride.cautions.join(' ')).toMatch(/above the design/);

    const reopened = await app.owner.post(`/api/plans/${planId}/reopen`);
    expect(reopened.body.approvalOverride).toBeNull();
  });

  it('a lot not ready (9.5 NTU) needs a reason; a plan without cautions approves without one', async () => {
    const hazy = await createLot(app.owner, { volumeL: 5000, tempC: 12 });
    await createLabResult(app.owner, hazy.id, { turbidityNtu: 9.5 });
    const { planId } = await chosenDraft(trainBody(app.world), { lotId: hazy.id });
    const bare = await app.owner.post(`/api/plans/${planId}/approve`);
    expect(bare.status).toBe(409);
    expect(bare.body.error.code).toBe('plan_needs_reason');
    expect(Object.values(bare.body.error.fields).join(' ')).toMatch(/not ready/);
    expect((await app.owner.post(`/api/plans/${planId}/approve`, { reason: 'Lab re-test at 08:00 before the filler starts.' })).status).toBe(200);

    const clean = await chosenDraft(trainBody(app.world));
    const res = await app.owner.post(`/api/plans/${clean.planId}/approve`);
    expect(res.status).toBe(200);
    expect(res.body.approvalOverride).toBeNull();
  });
});

describe('a cartridge stock shortfall needs a written reason', () => {
  it('a winery with no usable cartridges for the day: refused without a reason, approved with one; stocked, approved bare', async () => {
    const other = (await signUp(app.baseUrl, { wineryName: 'Approval Stock Winery' })).client;
    const w = await createPlanWorld(other);
    const { planId, detail } = await chosenDraft(trainBody(w), { client: other, lineId: w.lineId, lotId: w.lotId });
    expect(detail.needs.every((n) => n.verdict === 'short')).toBe(true);
    const bare = await other.post(`/api/plans/${planId}/approve`);
    expect(bare.status).toBe(409);
    expect(bare.body.error.code).toBe('plan_needs_reason');
    expect(Object.values(bare.body.error.fields).join(' ')).toMatch(/Stock: .* needs 3 for the day, 0 usable on hand, 3 short/);
    const ok = await other.post(`/api/plans/${planId}/approve`, { reason: 'Delivery due the day before.' });
    expect(ok.status).toBe(200);
    expect(ok.body.approvalOverride.cautions.join(' ')).toMatch(/short/);

    await stockPlanWorld(other, w, 3);
    const stocked = await chosenDraft(trainBody(w), { client: other, lineId: w.lineId, lotId: w.lotId });
    expect(stocked.detail.needs.every((n) => n.verdict === 'enough')).toBe(true);
    expect((await other.post(`/api/plans/${stocked.planId}/approve`)).status).toBe(200);

    // A membrane whose latest bubble point failed (2.0 < 3.2 bar) is no longer usable stock.
    const membranes = (await other.get(`/api/cartridges?typeId=${w.membraneTypeId}`)).body.items as { id: string }[];
    expect(membranes.length).toBe(3);
    const failed = await other.post(`/api/cartridges/${membranes[0].id}/integrity-tests`, { test: 'bubble-point', bubblePointBar: 2, wettingFluid: 'water' });
    expect(failed.status).toBe(201);
    const after = (await other.get(`/api/plans/${stocked.planId}`)).body as PlanDto;
    expect(after.needs.find((n) => n.kind === 'membrane')).toMatchObject({ cartridgesAvailable: 2, notUsable: 1, shortfall: 1, verdict: 'short' });
  });
});

describe('the day: needs with a set carried over, and every regeneration on the timeline', () => {
  it('two lots through the same train use one set; a small capacity puts each regeneration on the timeline', async () => {
    // Prefilter 3,000 L/m² × 0.45 m² × 9 = 12,150 L per load; membrane 2,000 × 0.7 × 9 = 12,600 L:
    // 6,000 L then 3,000 L fit one set of each (hand-calculated).
    const plan = await createPlan(app.owner, app.world.lineId);
    await addPlanLot(app.owner, plan.id, app.world.lotId, 6000);
    const two = await addPlanLot(app.owner, plan.id, app.world.secondLotId, 3000);
    const choose = async (planLotId: string, body: Record<string, unknown>) => {
      const withTrain = await addTrain(app.owner, plan.id, planLotId, body);
      const trainId = withTrain.lots.find((l) => l.id === planLotId)!.trains.at(-1)!.id;
      const res = await app.owner.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: trainId });
      expect(res.status).toBe(200);
      return res.body as PlanDto;
    };
    const [first, second] = two.lots;
    await choose(first.id, trainBody(app.world));
    const both = await choose(second.id, trainBody(app.world));
    expect(both.needs.map((n) => [n.kind, n.cartridgesNeeded, n.lotCodes])).toEqual([
      ['prefilter', 3, [first.lot.code]],
      ['membrane', 3, [first.lot.code]],
    ]);
    expect(both.timeline!.blocks.filter((b) => b.kind === 'regeneration' || b.kind === 'change')).toEqual([]);

    // Prefilter at 500 L/m²: 2,025 L per load, so 6,000 L takes 3 loads: regenerated after 2,025 and 4,050 L.
    const small = trainBody(app.world, { name: 'Small' });
    small.stages[0].capacityLPerM2 = 500;
    const withStops = await choose(first.id, small);
    const stops = withStops.timeline!.blocks.filter((b) => b.planLotId === first.id && b.kind !== 'run' && b.kind !== 'push-out');
    expect(stops.map((b) => [b.kind, b.label, b.minutes])).toEqual([
      ['regeneration', `${first.lot.code}: Regeneration of Prefilter`, 20],
      ['regeneration', `${first.lot.code}: Regeneration of Prefilter`, 20],
    ]);
    const runs = withStops.timeline!.blocks.filter((b) => b.planLotId === first.id && b.kind === 'run');
    const flow = withStops.requiredFlowLh!;
    expect(runs.map((b) => b.minutes)).toEqual([2025, 2025, 1950].map((l) => expect.closeTo((l / flow) * 60, 6)));
  });
});

describe('capacity from the lot’s Vmax disc test', () => {
  it('a membrane stage without a typed capacity takes it from the lot’s latest disc test, at its own clean ΔP', async () => {
    const lot = await createLot(app.owner, { volumeL: 5000, tempC: 12 });
    await createLabResult(app.owner, lot.id, { discDiameterMm: 47, discPressureBar: 2, discPoints: discPoints(2.4, 5000, 10) });
    const body = trainBody(app.world);
    delete (body.stages[1] as { capacityLPerM2?: number }).capacityLPerM2;
    const { detail } = await chosenDraft(body, { lotId: lot.id });
    const vmax = detail.lots[0].lot.vmaxLPerM2!;
    expect(vmax).toBeGreaterThan(0);
    const m = detail.lots[0].trains[0].sizing!.stages[1];
    expect(m.capacitySource).toBe('vmax');
    // v_T = v_max(1 − √(ΔP0/ΔP_T))/1.5 (shared reference "engineering" §7.6; SF 1.5 from memory)
    expect(m.capacityLPerM2).toBeCloseTo((vmax * (1 - Math.sqrt(m.cleanDpBar / m.terminalDpBar))) / 1.5, 6);
    expect(detail.lots[0].trains[0].sizing!.stages[0].capacitySource).toBe('stage');
  });
});
