import { expect, test } from '@playwright/test';
import { signInAs } from './support/sign-in';

test(
  'an auditor follows one element of one mill over time against its limit, with Ppk and Cpk, their formulas and ' +
    'intervals',
  async ({ page }) => {
    await signInAs(page, 'kiw-0401', '/heats');
    const panel = page.getByRole('region', { name: 'Trends by supplier' });
    await panel.getByLabel('Trend supplier').click();
    await page.getByRole('option', { name: 'Nordvik Titanium Mill' }).click();
    await expect(panel.locator('canvas')).toBeVisible();
    await expect(panel.getByTestId('trend-statistics')).toContainText(/n = \d+ · mean 0\.\d+ against ≤ 0\.13/);
    const indices = panel.getByRole('table', { name: 'Capability indices' });
    await expect(indices.getByRole('row', { name: /Ppk \(overall σ\)/ })).toContainText(/-?\d\.\d{3}/);
    const cpkRow = indices.getByRole('row', { name: /Cpk \(within σ, moving range\)/ });
    await expect(cpkRow).toContainText('σ̂ = MR̄ / 1.128');
    await expect(panel).toContainText('Ppk = min((USL − x̄) / 3s, (x̄ − LSL) / 3s)');
    await panel.scrollIntoViewIfNeeded();
    await page.screenshot({ path: 'test-results/trend.png', fullPage: true });
  },
);
