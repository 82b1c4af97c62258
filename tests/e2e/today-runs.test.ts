// @vitest-environment node
// Today lists the runs in progress with each stage's ΔP, forecast and alarm (desktop and phone),
// and the Care form takes the ΔP a clean-water flow was measured at.
import { beforeAll, describe, expect, it } from 'vitest';
import { addPlanLot, addTrain, createPlan, createPlanWorld, fillTrainHousings, trainBody } from '../factories/plans';
import { expectNoSeriousA11yViolations } from '../support/a11y';
import { DESKTOP, outputDir, PHONE, screenshot, setupBrowserApp } from '../support/browser';
import { addMember, signUp, type Client } from '../support/test-app';

const app = setupBrowserApp();
let owner: { client: Client; email: string };
let tech: { client: Client; email: string };
let runId: string;
let membraneSerial: string;

/** The runs card is the part of Today this file covers: axe looks inside it. */
const RUNS_CARD = '[data-testid="runs-in-progress"]';

beforeAll(async () => {
  const o = await signUp(app.baseUrl, { wineryName: 'Today Runs Cellars' });
  owner = { client: o.client, email: o.email };
  const world = await createPlanWorld(owner.client);
  const { membranes } = await fillTrainHousings(owner.client, world);
  membraneSerial = membranes[0].serial;
  const plan = await createPlan(owner.client, world.lineId, { name: 'Whites bottling day' });
  const planLotId = (await addPlanLot(owner.client, plan.id, world.lotId, 6000)).lots[0].id;
  const trainId = (await addTrain(owner.client, plan.id, planLotId, trainBody(world))).lots[0].trains[0].id;
  expect((await owner.client.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: trainId })).status).toBe(200);
  expect((await owner.client.post(`/api/plans/${plan.id}/approve`, { reason: 'Cartridges arrive the day before.' })).status).toBe(200);
  tech = await addMember(app, owner.client, 'technician');
  const run = await tech.client.post('/api/runs', { planLotId });
  expect(run.status).toBe(201);
  runId = run.body.id;
  const log = (stageIndex: number, volumeL: number, dpBar: number) =>
    tech.client.post(`/api/runs/${runId}/readings`, { clientKey: `${stageIndex}-${volumeL}`, stageIndex, volumeL, upstreamBar: 2 + dpBar, downstreamBar: 2, flowLh: 2400 });
  // The prefilter climbs towards terminal ΔP before the lot is done (an alarm); the membrane rises slowly.
  for (const [v, dp] of [[500, 0.2], [1000, 0.5], [1500, 0.85], [2000, 1.2]] as const) expect((await log(0, v, dp)).status).toBe(201);
  for (const [v, dp] of [[500, 0.1], [1000, 0.11], [1500, 0.125], [2000, 0.145]] as const) expect((await log(1, v, dp)).status).toBe(201);
});

describe('Today’s runs in progress', () => {
  it('the owner sees the open run with each stage’s ΔP, forecast and alarm, and opens the run from it (desktop)', async () => {
    const { context, page, errors } = await app.signIn(owner.email, { viewport: DESKTOP });
    await page.goto(`${app.baseUrl}/today`);
    const card = page.getByRole('region', { name: 'Runs in progress' });
    await card.waitFor();
    const stage0 = card.getByTestId('today-run-stage-0');
    await stage0.getByText(/^About .+ \/ (\d+ min|\d+ h \d{2} min|\d+ h|under 1 min) left$/).waitFor();
    await stage0.getByText(/Alarm: about .+ short/).waitFor();
    expect(await stage0.textContent()).toMatch(/ΔP 1\.2\d* bar of 1\.5\d* bar/);
    await card.getByTestId('today-run-stage-1').getByText(/left|beyond the readings|No forecast|not rising/).first().waitFor();
    expect(await card.textContent()).toContain('Whites bottling day');
    expect(await page.getByText(/Runs in progress, with their readings and forecasts, are on the/).count()).toBe(0);
    await expectNoSeriousA11yViolations(page, { include: RUNS_CARD });
    await screenshot(page, 'today-runs-desktop');
    await card.getByRole('link', { name: /Open run/ }).click();
    await page.waitForURL(new RegExp(`/runs/${runId}$`));
    await page.getByRole('heading', { name: 'Log reading' }).waitFor();
    expect(errors).toEqual([]);
    await context.close();
  });

  it('the technician’s phone shows the same at 390 px without sideways scrolling', async () => {
    const { context, page, errors } = await app.signIn(tech.email, { viewport: PHONE, mobile: true });
    await page.goto(`${app.baseUrl}/today`);
    const card = page.getByRole('region', { name: 'Runs in progress' });
    await card.getByTestId('today-run-stage-0').getByText(/^About .+ left$/).waitFor();
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    const box = await card.getByRole('link', { name: /Open run/ }).boundingBox();
    expect(box!.height).toBeGreaterThanOrEqual(44);
    await expectNoSeriousA11yViolations(page, { include: RUNS_CARD });
    await screenshot(page, 'today-runs-phone');
    await card.screenshot({ path: `${outputDir}/today-runs-phone-card.png` });
    expect(errors).toEqual([]);
    await context.close();
  });
});

describe('Care: the ΔP of a flow measurement', () => {
  it('defaults to the type’s specification ΔP and brings a flow measured at half of it to the reference (Darcy: flow ∝ ΔP)', async () => {
    const { context, page, errors } = await app.signIn(tech.email, { viewport: PHONE, mobile: true });
    await page.goto(`${app.baseUrl}/care`);
    await page.getByRole('heading', { name: 'Care', exact: true }).waitFor();
    await page.getByLabel('Cartridge serial').fill(membraneSerial);
    await page.getByRole('list', { name: 'Matching cartridges' }).getByRole('button').first().click();
    await page.getByRole('tab', { name: 'Log a cycle' }).waitFor();
    const dp = page.getByLabel('ΔP during the flow measurement');
    // The factory's membrane type gives 1,200 L/h per 10-inch at 0.1 bar: 3,600 L/h for 30 inches.
    expect(await dp.inputValue()).toBe('0.1');
    expect(await dp.getAttribute('inputmode')).toBe('decimal');
    await page.getByLabel('Clean-water flow after').fill('1800');
    await page.getByText(/Flow recovery 50\s*%/).waitFor();
    await dp.fill('0.05');
    await page.getByText(/Flow recovery 100\s*%/).waitFor();
    await screenshot(page, 'care-flow-dp-phone');
    await page.getByLabel('Temperature', { exact: true }).fill('80');
    await page.getByRole('button', { name: 'Save cycle' }).click();
    await page.getByRole('heading', { name: /cycle saved/ }).waitFor();
    const cartridges = (await owner.client.get(`/api/cartridges?q=${membraneSerial}`)).body.items as { id: string }[];
    const detail = (await owner.client.get(`/api/cartridges/${cartridges[0].id}`)).body;
    expect(detail.life.recovery.latestPct).toBeCloseTo(100, 6);
    // The cartridge's history keeps the flow with the ΔP it was measured at.
    await page.goto(`${app.baseUrl}/cartridges/${cartridges[0].id}`);
    await page.getByText(/^water flow .* at 0\.05\d*\s*bar$/).first().waitFor();
    expect(errors).toEqual([]);
    await context.close();
  });
});
