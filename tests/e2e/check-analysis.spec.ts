import { expect, test } from '@playwright/test';
import { signInAs } from './support/sign-in';
import { openedDialog } from './support/dialogs';

// ASTM F67 grade 4 oxygen: heat limit ≤ 0.40, product-analysis tolerance 0.03 over (DOMAIN.md §1.1, S1).
test(
  '[E2E-CHECK-ANALYSIS] an engineer records our own check analysis of a heat the schedule marks, and the heat ' +
    'page judges it against the widened limits',
  async ({ page }) => {
    await signInAs(page, 'kiw-0101', '/heats');
    const due = page.getByRole('region', { name: /heats? awaiting our check analysis/ });
    await expect(due).toContainText('Every heat from a conditionally approved supplier is checked');
    await page.getByRole('textbox', { name: 'Search heats' }).fill('BAW-7749');
    await page.getByRole('table').getByRole('link', { name: 'BAW-7749' }).click();
    await expect(page.getByRole('heading', { level: 1, name: 'Heat BAW-7749' })).toBeVisible();
    const check = page.getByRole('region', { name: 'Independent check analysis' });
    await expect(check).toContainText('due — not recorded');
    await expect(check).toContainText(
      'The heat cannot be accepted until our own check analysis is recorded and conforms.',
    );

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
    await expect(check.getByRole('table', { name: 'Check analysis TML-E2E-7749' })).toContainText(
      'beyond the tolerance',
    );
    await expect(check).toContainText('The latest check analysis does not conform; the heat cannot be accepted.');
    await page.screenshot({ path: 'test-results/check-analysis.png', fullPage: true });
  },
);

test(
  '[E2E-CHECK-RULE] a QA approver sets a check analysis rule for one mill and specification from the supplier ' +
    'page',
  async ({ page }) => {
    await signInAs(page, 'kiw-0301', '/suppliers');
    await page.getByRole('textbox', { name: 'Search suppliers' }).fill('Castellane');
    await page.getByRole('link', { name: 'Castellane Special Metals' }).click();
    const rules = page.getByRole('region', { name: 'Check analysis rules' });
    await expect(rules).toContainText('ASTM F136');
    await rules.getByRole('button', { name: 'Set a rule…' }).click();
    const dialog = await openedDialog(page, 'Set a check analysis rule');
    await dialog.getByLabel('Specification').click();
    await page.getByRole('option', { name: 'ASTM F67' }).click();
    await dialog.getByLabel(/Check the first heat and every Nth/).fill('1');
    await dialog.getByRole('button', { name: 'Set rule' }).click();
    await expect(dialog).toContainText('Give a reason of at least 3 characters');
    await dialog.getByLabel('Reason').fill('Grade 2 bar is new from this mill: check every heat for now');
    await dialog.getByRole('button', { name: 'Set rule' }).click();
    await expect(dialog).toBeHidden();
    const row = rules.getByRole('row', { name: /ASTM F67/ });
    await expect(row).toContainText('every heat');
    await expect(row).toContainText('Grade 2 bar is new from this mill');
    await page.screenshot({ path: 'test-results/check-analysis-rule.png', fullPage: true });
  },
);
