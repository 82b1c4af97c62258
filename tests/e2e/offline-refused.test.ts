// @vitest-environment node
// Entries the server refuses after a spell without signal: the technician sees each one with the
// server's reason on the Waiting page and fixes, moves or discards it explicitly. Nothing is
// dropped on its own, and signing out with entries still on the device warns first.
import { randomUUID } from 'node:crypto';
import { sql } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { approvedPlanLot, startRun } from '../factories/plans';
import { expectNoSeriousA11yViolations } from '../support/a11y';
import { DESKTOP, PHONE, screenshot, setupBrowserApp } from '../support/browser';
import { logReading } from '../support/run-page';
import { addMember, signUp } from '../support/test-app';

const app = setupBrowserApp();

async function storedVolumes(runId: string) {
  const res = await app.db.execute(sql`select volume_l::float as v from run_readings where run_id = ${runId}::uuid order by volume_l`);
  return (res.rows as { v: number }[]).map((r) => r.v);
}

describe('entries the server refuses after a spell offline', () => {
  it('shows each refused entry with its reason; the technician fixes one, moves one to another run and discards one; sign-out warns while any is kept', async () => {
    const { client: owner } = await signUp(app.baseUrl, { wineryName: 'Refused Entry Cellars' });
    const { planLotId } = await approvedPlanLot(owner, { name: 'Refusal day' });
    const second = await approvedPlanLot(owner, { name: 'Second line day' });
    const tech = await addMember(app, owner, 'technician');
    const run = await startRun(tech.client, planLotId);
    const other = await startRun(tech.client, second.planLotId);

    const { context, page, errors } = await app.signIn(tech.email, { viewport: PHONE, mobile: true });
    await page.goto(`${app.baseUrl}/runs/${run.id}`);
    await page.getByRole('heading', { name: 'Log reading' }).waitFor();
    await page.waitForTimeout(1000);

    // Offline, a reading at 500 L; meanwhile a colleague logs 2,000 L on the same stage.
    await context.setOffline(true);
    await logReading(page, '500', '2.20', '2.00');
    await page.getByText('Kept — waiting to send').waitFor();
    const colleague = await owner.post(`/api/runs/${run.id}/readings`, { clientKey: randomUUID(), stageIndex: 0, volumeL: 2000, upstreamBar: 2.3, downstreamBar: 2.0 });
    expect(colleague.status).toBe(201);

    // Back online: the server refuses it (litres cannot go down); it is kept, with the reason.
    await context.setOffline(false);
    const bar = page.getByTestId('offline-bar');
    await bar.getByRole('link', { name: '1 entry refused — check it' }).waitFor({ timeout: 30_000 });
    await bar.getByRole('link', { name: '1 entry refused — check it' }).click();
    await page.getByRole('heading', { name: 'Waiting to send' }).waitFor();
    const refused = page.getByRole('listitem').filter({ hasText: 'refused by the server' });
    await refused.getByText(/Litres cannot go down: the last reading of this stage was 2000 L/).waitFor();
    await screenshot(page, 'waiting-refused-value-phone');
    await expectNoSeriousA11yViolations(page);

    // Fix: the litres typed again, sent again, stored.
    await refused.getByRole('button', { name: 'Fix' }).click();
    const fix = page.getByRole('dialog');
    await fix.getByLabel('Litres through the train (L)').fill('2500');
    await fix.getByRole('button', { name: 'Send again' }).click();
    await page.getByText('Nothing is waiting').waitFor({ timeout: 30_000 });
    await expect.poll(() => storedVolumes(run.id), { timeout: 20_000 }).toEqual([2000, 2500]);

    // Offline again, two more readings; the run is closed on the server meanwhile.
    await page.goto(`${app.baseUrl}/runs/${run.id}`);
    await page.getByRole('heading', { name: 'Log reading' }).waitFor();
    await context.setOffline(true);
    await logReading(page, '3000', '2.40', '2.00');
    await logReading(page, '3500', '2.50', '2.00');
    await bar.getByText('2 entries waiting to send').waitFor();
    // Signing out while they wait asks first.
    await page.getByRole('button', { name: 'Sign out' }).first().click();
    await page.getByRole('dialog').getByRole('heading', { name: '2 entries have not been sent' }).waitFor();
    await page.getByRole('dialog').getByRole('button', { name: 'Stay signed in' }).click();
    await page.getByRole('dialog').waitFor({ state: 'detached' });
    expect((await owner.post(`/api/runs/${run.id}/close`, {})).status).toBe(200);
    await context.setOffline(false);
    await bar.getByRole('link', { name: '2 entries refused — check them' }).waitFor({ timeout: 30_000 });

    // Kept across a reload: nothing was dropped.
    await page.goto(`${app.baseUrl}/waiting`);
    await page.getByRole('heading', { name: 'Waiting to send' }).waitFor();
    const closed = page.getByRole('listitem').filter({ hasText: 'This run is closed' });
    await expect.poll(() => closed.count(), { timeout: 20_000 }).toBe(2);
    await screenshot(page, 'waiting-refused-closed-phone');
    await expectNoSeriousA11yViolations(page);
    await page.setViewportSize(DESKTOP);
    await screenshot(page, 'waiting-refused-closed-desktop');
    await page.setViewportSize(PHONE);

    // Signing out with entries kept on the device asks first; staying keeps them.
    await page.getByRole('button', { name: 'Sign out' }).first().click();
    const warn = page.getByRole('dialog');
    await warn.getByRole('heading', { name: '2 entries have not been sent' }).waitFor();
    await warn.getByText('All were refused by the server and wait on the Waiting page for you to fix, move or discard.', { exact: false }).waitFor();
    await screenshot(page, 'waiting-sign-out-warning-phone');
    await warn.getByRole('button', { name: 'Stay signed in' }).click();
    await warn.waitFor({ state: 'detached' });
    expect(await closed.count()).toBe(2);

    // Move the 3,000 L reading to the other run in progress (its second stage).
    const first = closed.filter({ hasText: '3,000 L' });
    await first.getByRole('button', { name: 'Move' }).click();
    const move = page.getByRole('dialog');
    await move.getByRole('option', { name: /Second line day/ }).waitFor({ state: 'attached' });
    await move.getByLabel('Run in progress').selectOption({ label: (await move.getByRole('option', { name: /Second line day/ }).textContent())! });
    await move.getByLabel('Stage number (the first stage is 1)').fill('2');
    await move.getByRole('button', { name: 'Move and send' }).click();
    await expect.poll(() => closed.count(), { timeout: 20_000 }).toBe(1);
    await expect.poll(() => storedVolumes(other.id), { timeout: 20_000 }).toEqual([3000]);
    const moved = await app.db.execute(sql`select stage_index as s from run_readings where run_id = ${other.id}::uuid`);
    expect(moved.rows).toEqual([{ s: 1 }]);

    // Discard the 3,500 L reading: only after saying so.
    const last = closed.filter({ hasText: '3,500 L' });
    await last.getByRole('button', { name: 'Discard' }).click();
    const confirm = page.getByRole('dialog');
    await confirm.getByRole('heading', { name: 'Discard this entry?' }).waitFor();
    await confirm.getByRole('button', { name: 'Keep it' }).click();
    expect(await closed.count()).toBe(1);
    await last.getByRole('button', { name: 'Discard' }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Discard' }).click();
    await page.getByText('Nothing is waiting').waitFor();
    expect(await storedVolumes(run.id)).toEqual([2000, 2500]);
    expect(await bar.count()).toBe(0);

    // Nothing kept any more: signing out asks nothing.
    await page.getByRole('button', { name: 'Sign out' }).first().click();
    await page.waitForURL(/\/sign-in$/);
    expect(errors.filter((e) => !/Failed to fetch|ERR_INTERNET_DISCONNECTED|Failed to load resource/.test(e))).toEqual([]);
    await context.close();
  });
});
