import { expect, test } from '@playwright/test';
import { signInAs } from './support/sign-in';
import { openedDialog } from './support/dialogs';

// ASTM F67 grade 4 oxygen: heat limit ≤ 0.40, product-analysis tolerance 0.03 over (DOMAIN.md §1.1, S1).
test('[E2E-CHECK-ANALYSIS] an engineer records our own check analysis of a heat the schedule marks, and the heat page judges it against the widened limits', async ({ page }) => {
  await signInAs(page, 'kiw-0101', '/heats');
  const due = page.getByRole('region', { name: /heats? awaiting our check analysis/ });
  await expect(due).toContainText('Every heat from a conditionally approved supplier is checked');
  await page.getByRole('textbox', { name: 'Search heats' }).fill('BAW-7749');
  await page.getByRole('table').getByRole('link', { name: 'BAW-7749' }).click();
  await expect(page.getByRole('heading', { level: 1, name: 'Heat BAW-7749' })).toBeVisible();
  const check = page.getByRole('region', { name: 'Independent check analysis' });
  await expect(check).toContainText('due — not recorded');
  await expect(check).toContainText('The heat cannot be accepted until our own check analysis is recorded and conforms.');

  await check.getByRole('button', { name: 'Record a check analysis…' }).click();
  const dialog = await openedDialog(page, 'Record a check analysis');
  await dialog.getByRole('button', { name: 'Record and evaluate' }).click();
  await expect(dialog).toContainText('Name the laboratory');
  await dialog.getByLabel('Laboratory').fill('Tarnbridge materials laboratory');
  await dialog.getByLabel('Report reference').fill('TML-E2E-7749');
  await dialog.getByLabel(/^O \(heat ≤ 0\.40, check ≤ 0\.43\)/).fill('0.44');
  await dialog.getByLabel(/^Fe /).fill('0.27');
  await dialog.getByRole('button', { name: 'Record and evaluate' }).click();
  await expect(dialog).toBeHidden();
  await expect(check).toContainText('does not conform');
  await expect(check.getByRole('table', { name: 'Check analysis TML-E2E-7749' })).toContainText('beyond the tolerance');
  await expect(check).toContainText('The latest check analysis does not conform; the heat cannot be accepted.');
  await page.screenshot({ path: 'test-results/check-analysis.png', fullPage: true });
});
