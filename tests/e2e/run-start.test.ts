// @vitest-environment node
import { describe, expect, it } from 'vitest';
import { approvedPlanLot, createPlanWorld, installCartridges } from '../factories/plans';
import { expectNoSeriousA11yViolations } from '../support/a11y';
import { setupBrowserApp, DESKTOP, PHONE, screenshot } from '../support/browser';
import { addMember, signUp } from '../support/test-app';

const app = setupBrowserApp();

describe('starting a run on the cartridges physically in the train', () => {
  it('a technician’s start is refused for a mismatched housing; the cellar master starts it with a written reason', async () => {
    const { client: owner } = await signUp(app.baseUrl, { wineryName: 'Start Check Cellars' });
    const world = await createPlanWorld(owner);
    // membranes sit in the housing the plan gives the prefilter
    await installCartridges(owner, world.membraneTypeId, world.prefilterHousingId, 3);
    await installCartridges(owner, world.membraneTypeId, world.membraneHousingId, 3);
    await approvedPlanLot(owner, { world, fill: false, name: 'Start check day' });
    const tech = await addMember(app, owner, 'technician');
    const master = await addMember(app, owner, 'cellar-master');

    // The technician, on a phone: refused, with the reason and what to do; no override field.
    const phone = await app.signIn(tech.email, { viewport: PHONE, mobile: true });
    await phone.page.goto(`${app.baseUrl}/runs`);
    await phone.page.getByRole('button', { name: 'Start run' }).click();
    const dialog = phone.page.getByRole('dialog');
    await dialog.getByRole('heading', { name: 'The run cannot start yet' }).waitFor();
    expect(await dialog.textContent()).toMatch(/but the plan asks for/);
    await dialog.getByRole('link', { name: 'Install the planned cartridges' }).waitFor();
    expect(await dialog.getByLabel(/Start anyway/).count()).toBe(0);
    expect(await dialog.textContent()).toMatch(/A cellar master or the owner may start anyway/);
    await screenshot(phone.page, 'run-start-refused-phone');
    expect(phone.errors).toEqual([]);
    await phone.context.close();

    // The cellar master, at a desk: starts anyway with a written reason, kept on the run.
    const desk = await app.signIn(master.email, { viewport: DESKTOP });
    await desk.page.goto(`${app.baseUrl}/runs`);
    await desk.page.getByRole('button', { name: 'Start run' }).click();
    const d2 = desk.page.getByRole('dialog');
    await d2.getByRole('heading', { name: 'The run cannot start yet' }).waitFor();
    await d2.getByRole('button', { name: 'Plan with what is installed' }).waitFor();
    await screenshot(desk.page, 'run-start-override-desktop');
    await d2.getByRole('button', { name: 'Start with this reason' }).click();
    await d2.getByText(/Write why the run starts anyway/).waitFor();
    await d2.getByLabel(/Start anyway: why\?/).fill('Double membrane chosen for this lot; prefilters out of stock.');
    await d2.getByRole('button', { name: 'Start with this reason' }).click();
    await desk.page.waitForURL(/\/runs\/[0-9a-f-]+$/);
    const override = desk.page.getByTestId('run-override');
    await override.waitFor();
    expect(await override.textContent()).toMatch(/prefilters out of stock/);
    await desk.page.getByRole('heading', { name: 'Cartridges in the train' }).waitFor();
    await screenshot(desk.page, 'run-started-with-override-desktop');

    // A reading typed wrong, corrected from the run page: the original stays, struck through.
    await desk.page.getByLabel('Litres through the train so far').fill('800');
    await desk.page.getByLabel('Upstream pressure').fill('3.4');
    await desk.page.getByLabel('Downstream pressure').fill('2.0');
    await desk.page.getByRole('button', { name: 'Save reading' }).click();
    await desk.page.getByRole('heading', { name: 'Readings and corrections' }).waitFor();
    await desk.page.getByRole('button', { name: 'Correct', exact: true }).click();
    const fix = desk.page.getByRole('dialog');
    await fix.getByLabel('Upstream').fill('2.34');
    await fix.getByLabel(/Why/).fill('Typed 3.4 for 2.34.');
    await fix.getByRole('button', { name: 'Save correction' }).click();
    await desk.page.getByText(/Corrected by .* “Typed 3.4 for 2.34.”/).waitFor();
    await desk.page.getByLabel(/As logged:/).waitFor();
    // The change dialog, at the prefilters' terminal ΔP.
    await desk.page.getByRole('button', { name: 'Change cartridges' }).click();
    await desk.page.getByRole('dialog').getByRole('heading', { name: 'Change cartridges' }).waitFor();
    await screenshot(desk.page, 'run-change-dialog-desktop');
    await desk.page.getByRole('dialog').getByRole('button', { name: 'Cancel' }).click();
    await screenshot(desk.page, 'run-corrected-reading-desktop');
    await expectNoSeriousA11yViolations(desk.page);
    await desk.page.setViewportSize(PHONE);
    await screenshot(desk.page, 'run-started-with-override-phone');
    expect(desk.errors).toEqual([]);
    await desk.context.close();
  });
});
