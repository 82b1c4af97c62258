// Accessibility checks in the browser tests: axe-core (WCAG 2.x A and AA rules) on the page as
// it stands. A page passes with no finding of "serious" or "critical" impact.
import AxeBuilder from '@axe-core/playwright';
import type { Page } from 'playwright-core';
import { expect } from 'vitest';

export type A11yFinding = { rule: string; impact: string; help: string; targets: string[] };

/** The serious and critical axe findings on the page (or inside `include`, a CSS selector). */
export async function seriousA11yViolations(page: Page, opts: { include?: string } = {}): Promise<A11yFinding[]> {
  let builder = new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'best-practice']);
  if (opts.include) builder = builder.include(opts.include);
  const results = await builder.analyze();
  return results.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => ({ rule: v.id, impact: v.impact ?? '', help: v.help, targets: v.nodes.map((n) => n.target.join(' ')) }));
}

/** Fails the test, naming each rule and element, when axe finds anything serious or critical. */
export async function expectNoSeriousA11yViolations(page: Page, opts: { include?: string } = {}) {
  expect(await seriousA11yViolations(page, opts)).toEqual([]);
}
