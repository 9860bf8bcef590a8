import { expect, test } from '@playwright/test';
import { signInAs } from './support/sign-in';
import { openedDialog } from './support/dialogs';

test(
  '[E2E-SCREENING] a QA reviewer meets a heat flagged by the certificate screening and acknowledges the finding ' +
    'with a reason',
  async ({ page }) => {
    await signInAs(page, 'kiw-0201', '/heats');
    await page.getByRole('table').getByRole('link', { name: 'BAW-7892' }).click();
    await expect(page.getByRole('heading', { level: 1, name: 'Heat BAW-7892' })).toBeVisible();
    const screening = page.getByRole('region', { name: 'Certificate screening' });
    await expect(screening).toContainText('16 heats of this supplier and specification compared');
    await expect(screening).toContainText('Values bunched just inside a limit');
    await expect(screening).toContainText('1 finding to acknowledge before the heat can be accepted');
    await screening.getByRole('button', { name: 'Acknowledge…' }).click();
    const dialog = await openedDialog(page, 'Acknowledge a screening finding');
    await dialog.getByRole('button', { name: 'Acknowledge finding' }).click();
    await expect(dialog).toContainText('Say what you checked, in at least 10 characters');
    await dialog
      .getByLabel('What you checked, and why the finding does not stop acceptance')
      .fill('Check analysis ordered; the mill confirmed its lab re-tested this heat');
    await dialog.getByRole('button', { name: 'Acknowledge finding' }).click();
    await expect(dialog).toBeHidden();
    await expect(screening).toContainText('Acknowledged by Aisling Ní Bhriain');
    await expect(screening).toContainText('the mill confirmed its lab re-tested this heat');
    await expect(screening.getByRole('button', { name: 'Acknowledge…' })).toHaveCount(0);
    await page.screenshot({ path: 'test-results/certificate-screening.png', fullPage: true });

    await page.getByRole('link', { name: 'Heats and certificates' }).first().click();
    await page.getByRole('link', { name: 'Suppliers' }).click();
    await expect(page.getByRole('heading', { level: 1, name: 'Suppliers' })).toBeVisible();
    await page.getByRole('textbox', { name: 'Search suppliers' }).fill('Brannock');
    await expect(page.getByRole('table').first()).toContainText('Conditionally approved');
    await page.getByRole('link', { name: 'Brannock Alloy Works' }).click();
    await expect(page.getByRole('heading', { level: 1, name: 'Brannock Alloy Works' })).toBeVisible();
    const group = page.getByRole('region', { name: 'ASTM F67 grade 4' });
    await expect(group).toContainText('Values bunched just inside a limit');
    await expect(group).toContainText(/[1-9]\d* of 11 heats acknowledged/);
    await page.screenshot({ path: 'test-results/supplier-screening.png', fullPage: true });
  },
);
