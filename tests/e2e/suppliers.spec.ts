import { expect, test } from '@playwright/test';
import { signInAs } from './support/sign-in';
import { openedDialog } from './support/dialogs';

const typing = { delay: 50 };

test(
  '[E2E-SUPPLIERS] a QA approver adds a new mill, makes it conditional and then disqualifies it, confirming, ' +
    'each with a reason',
  async ({ page }) => {
    test.setTimeout(90_000);
    const mill = `Harrowgate Forge ${Date.now().toString().slice(-5)}`;
    await signInAs(page, 'kiw-0301', '/suppliers');
    await expect(page.getByRole('heading', { level: 1, name: 'Suppliers' })).toBeVisible();
    await page.getByRole('button', { name: 'Add a supplier' }).click();
    const dialog = await openedDialog(page, 'Add a supplier');
    await dialog.getByLabel('Name').pressSequentially(mill, typing);
    await dialog.getByLabel('Country').pressSequentially('Wales', typing);
    await dialog.getByRole('button', { name: 'Add supplier' }).click();
    await expect(dialog.getByText('Choose the supplier’s approval')).toBeVisible();
    await expect(dialog.getByText('Give a reason of at least 3 characters')).toBeVisible();
    await dialog.getByRole('combobox', { name: 'Approval' }).click();
    await page.getByRole('option', { name: 'Approved', exact: true }).click();
    await dialog
      .getByLabel('Reason (kept in the audit trail)')
      .pressSequentially('Audit AU-2026-31 passed; certificates to EN 10204 3.1', typing);
    await page.screenshot({ path: 'test-results/supplier-add.png' });
    await dialog.getByRole('button', { name: 'Add supplier' }).click();
    await expect(page.getByRole('heading', { level: 1, name: mill })).toBeVisible();
    await expect(page.locator('.page-lead')).toContainText('Approved');

    await page.getByRole('button', { name: 'Change approval' }).click();
    const change = await openedDialog(page, `Approval of ${mill}`);
    await change.getByRole('combobox', { name: 'Approval' }).click();
    await page.getByRole('option', { name: 'Conditionally approved' }).click();
    await change
      .getByLabel('Reason (kept in the audit trail)')
      .pressSequentially('Two certificates with identical results', typing);
    await change.getByRole('button', { name: 'Change approval' }).click();
    await expect(change).toBeHidden();
    await expect(page.locator('.page-lead')).toContainText('Conditionally approved');

    await page.getByRole('button', { name: 'Change approval' }).click();
    const disqualify = await openedDialog(page, `Approval of ${mill}`);
    await disqualify.getByRole('combobox', { name: 'Approval' }).click();
    await page.getByRole('option', { name: 'Disqualified' }).click();
    await disqualify
      .getByLabel('Reason (kept in the audit trail)')
      .pressSequentially('Heat numbers re-stamped on bar', typing);
    await disqualify.getByRole('button', { name: 'Change approval' }).click();
    await expect(disqualify.getByText('No heat of this supplier can be accepted afterwards')).toBeVisible();
    await page.waitForTimeout(500); // let the warning finish appearing before the picture
    await page.screenshot({ path: 'test-results/supplier-disqualify-confirm.png' });
    await disqualify.getByRole('button', { name: 'Disqualify' }).click();
    await expect(disqualify).toBeHidden();
    await expect(page.locator('.page-lead')).toContainText('Disqualified');
    await page.screenshot({ path: 'test-results/supplier-disqualified.png', fullPage: true });
  },
);
