// Steps on the run page shared by browser tests.
import type { Page } from 'playwright-core';

/** Logs one reading through the run page's form and waits for its line in the status area (the litres, en formatting). */
export async function logReading(page: Page, litres: string, up: string, down: string) {
  await page.getByLabel('Litres through the train so far').fill(litres);
  await page.getByLabel('Upstream pressure').fill(up);
  await page.getByLabel('Downstream pressure').fill(down);
  await page.getByRole('button', { name: 'Save reading' }).click();
  await page.getByRole('status').filter({ hasText: `${Number(litres).toLocaleString('en')} L` }).first().waitFor();
}
