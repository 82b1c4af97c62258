// @vitest-environment node
import { describe, expect, it } from 'vitest';
import { expectNoSeriousA11yViolations } from '../support/a11y';
import { setupBrowserApp, DESKTOP, PHONE, screenshot, outputDir } from '../support/browser';

const app = setupBrowserApp({ demo: true });

describe('Care on a phone in the cellar', () => {
  it('a technician finds a cartridge, logs a hot-water cycle and records a bubble-point test', async () => {
    const { context, page, errors } = await app.signIn('tech@quillwater.test', { viewport: PHONE, mobile: true });
    await page.goto(`${app.baseUrl}/care`);
    await page.getByRole('heading', { name: 'Care', exact: true }).waitFor();
    await page.getByRole('list', { name: 'Recent care' }).waitFor();
    await screenshot(page, 'care-find-phone');
    await expectNoSeriousA11yViolations(page);

    // Find a demo membrane by its serial.
    await page.getByLabel('Cartridge serial').fill('QW-PES045');
    const first = page.getByRole('list', { name: 'Matching cartridges' }).getByRole('button').first();
    await first.waitFor();
    const serial = (await first.locator('.num').textContent())!.trim();
    await first.click();
    await page.getByText(serial, { exact: true }).first().waitFor();
    await page.getByRole('tab', { name: 'Log a cycle' }).waitFor();

    // Log a hot-water cycle with the water flow before and after.
    await page.getByLabel('What was done').selectOption('hot-water');
    await page.getByText('Hot water and steam scald').waitFor();
    await page.getByLabel('Temperature', { exact: true }).fill('82');
    await page.getByLabel('Duration').fill('30');
    await page.getByLabel('Clean-water flow before').fill('3000');
    await page.getByLabel('Clean-water flow after').fill('4000');
    await page.getByText(/Flow recovery \d+/).waitFor();
    await expectNoSeriousA11yViolations(page);
    await screenshot(page, 'care-cycle-phone');
    await page.screenshot({ path: `${outputDir}/care-cycle-phone-view.png` });
    // Inputs open the numeric keypad.
    expect(await page.getByLabel('Temperature', { exact: true }).getAttribute('inputmode')).toBe('decimal');
    await page.getByRole('button', { name: 'Save cycle' }).click();
    await page.getByRole('heading', { name: 'Hot water cycle saved' }).waitFor();
    await page.getByRole('status').getByText(/care cycles left|No life forecast|ended/).first().waitFor();
    expect(await page.getByRole('link', { name: 'Open the cartridge page' }).getAttribute('href')).toMatch(/^\/cartridges\/[0-9a-f-]+$/);
    await page.getByRole('list', { name: 'Recent care' }).getByText(serial).first().waitFor();
    await screenshot(page, 'care-cycle-saved-phone');
    await page.screenshot({ path: `${outputDir}/care-cycle-saved-phone-view.png` });

    // Record a bubble-point test: the preview says fail below the minimum, then pass; the saved verdict shows big.
    await page.getByRole('button', { name: 'Log more care' }).click();
    await page.getByRole('tab', { name: 'Record an integrity test' }).click();
    await page.getByText('The housing is under pressure during the test').waitFor();
    await page.getByLabel('Test', { exact: true }).selectOption('bubble-point');
    await page.getByLabel('Bubble point read').fill('2.9');
    await page.getByText('Would fail').waitFor();
    await page.getByText(/2\.9 bar is below the minimum 3\.2 bar/).waitFor();
    await page.getByLabel('Bubble point read').fill('3.5');
    await page.getByText('Would pass').waitFor();
    await screenshot(page, 'care-test-phone');
    await page.screenshot({ path: `${outputDir}/care-test-phone-view.png` });
    await page.getByRole('button', { name: 'Save test' }).click();
    await page.getByRole('heading', { name: 'Passed' }).waitFor();
    await page.getByText(/3\.5 bar meets the minimum 3\.2 bar/).first().waitFor();
    await screenshot(page, 'care-test-saved-phone');
    await page.screenshot({ path: `${outputDir}/care-test-saved-phone-view.png` });

    // The cartridge page shows the new history entries.
    await page.getByRole('link', { name: 'Open the cartridge page' }).click();
    await page.getByRole('heading', { name: serial }).first().waitFor();
    await page.getByRole('list', { name: 'History' }).getByText('Integrity test (bubble point)').first().waitFor();

    // No horizontal scrolling at 390 px.
    await page.goto(`${app.baseUrl}/care`);
    await page.getByRole('list', { name: 'Recent care' }).waitFor();
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    expect(errors).toEqual([]);
    await context.close();
  });

  it('shows the screen on a desktop', async () => {
    const { context, page, errors } = await app.signIn('cellar@quillwater.test', { viewport: DESKTOP });
    await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Care' }).click();
    await page.getByRole('heading', { name: 'Care', exact: true }).waitFor();
    await page.getByLabel('Cartridge serial').fill('QW-PES045');
    await page.getByRole('list', { name: 'Matching cartridges' }).getByRole('button').first().click();
    await page.getByRole('tab', { name: 'Record an integrity test' }).click();
    await page.getByLabel('Test', { exact: true }).selectOption('pressure-hold');
    await page.getByLabel('Pressure decay read').fill('20');
    await page.getByRole('list', { name: 'Recent care' }).waitFor();
    await screenshot(page, 'care-desktop');
    await expectNoSeriousA11yViolations(page);
    expect(errors).toEqual([]);
    await context.close();
  });
});
