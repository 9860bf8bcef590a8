import AxeBuilder from '@axe-core/playwright';
import { expect, type Page } from '@playwright/test';

/**
 * Runs axe-core (WCAG 2.1 A and AA rules, Deque's axe-core from the registry) on what the page
 * shows now and fails on any serious or critical violation, naming the rule and the elements.
 */
export async function expectAccessible(page: Page, screen: string): Promise<void> {
  // Judge what a person sees once it has settled, not a banner halfway through fading in.
  // Twice, a moment apart: a panel that loads its own data starts its fade-in after the page's has ended.
  for (let settle = 0; settle < 2; settle++) {
    await page.waitForFunction(() => document.getAnimations().every((animation) => animation.playState !== 'running'));
    await page.waitForTimeout(250);
  }
  const results = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
  const serious = results.violations
    .filter((violation) => violation.impact === 'serious' || violation.impact === 'critical')
    .map((violation) => {
      const nodes = violation.nodes
        .slice(0, 4)
        .map((node) => `${node.target.join(' ')} [${(node.failureSummary ?? '').replace(/\s+/g, ' ').slice(0, 170)}]`);
      return `${violation.id} (${violation.impact}): ${violation.help} — ${nodes.join(' | ')}`;
    });
  expect.soft(serious, `axe-core on ${screen}`).toEqual([]);
}
