import { expect, test } from '@playwright/test';
import { signInAs } from './support/sign-in';
import { openedDialog } from './support/dialogs';

const typing = { delay: 60 };

test(
  '[E2E-METHOD-SCOPE] QA records the firm’s own validation of a stainless steel method for cobalt-chromium; an ' +
    'engineer then routes a cerebrospinal-fluid part through it, and cannot pick a method outside its material',
  async ({ page }) => {
    test.setTimeout(120_000);
    const suffix = Date.now().toString().slice(-5);
    const reference = `VR-E2E-${suffix}`;

    // A QA approver reads the method's scope and records the firm's validation, typing at a person's pace.
    await signInAs(page, 'kiw-0301', '/process-methods');
    const nitric3 = page.getByRole('region', { name: 'Method A967-NITRIC-3' });
    await expect(nitric3).toContainText('Scope covers');
    await expect(nitric3).toContainText('Stainless steel');
    await nitric3.getByRole('button', { name: 'Record the firm’s validation for another material' }).click();
    const dialog = await openedDialog(page, 'Record the firm’s validation of A967-NITRIC-3');
    await dialog.getByLabel('Material').click();
    // Materials the method's own scope covers are not offered.
    await expect(page.getByRole('option', { name: 'Stainless steel' })).toHaveCount(0);
    await page.getByRole('option', { name: 'Cobalt-chromium alloy' }).click();
    await dialog.getByLabel('Validation report').pressSequentially(reference, typing);
    await dialog.getByLabel('What the validation showed').pressSequentially('short', typing);
    await dialog.getByLabel('Validation report').click();
    await expect(dialog.getByText('Say what the validation showed (at least 10 characters)')).toBeVisible();
    await dialog
      .getByLabel('What the validation showed')
      .pressSequentially(' — three worst-case F1537 lots passed water immersion', { delay: 25 });
    await expect(dialog.getByText('Say what the validation showed (at least 10 characters)')).toHaveCount(0);
    await page.waitForTimeout(600);
    await dialog.getByRole('button', { name: 'Record validation' }).click();
    await expect(dialog).toBeHidden();
    await expect(nitric3).toContainText(`Cobalt-chromium alloy — ${reference}`);
    await expect(nitric3.getByText('Firm’s own', { exact: true })).toBeVisible();
    await page.screenshot({ path: 'test-results/process-methods-firm-validation.png', fullPage: true });

    // An engineer registers a cobalt-chromium part that touches cerebrospinal fluid.
    await signInAs(page, 'kiw-0101', '/parts');
    await page.getByRole('button', { name: 'Register a part' }).click();
    const register = await openedDialog(page, 'Register a part');
    await register.getByLabel('Part number').pressSequentially(`E2E-CSF-${suffix}`, typing);
    await register.getByLabel('GTIN (with check digit)').pressSequentially('09521230000123', typing);
    await register.getByLabel('Description').pressSequentially('Shunt connector, cobalt-chromium', typing);
    await register.locator('.p-multiselect').click();
    await page.getByRole('option', { name: 'ASTM F1537' }).click();
    // Close the list by clicking outside it (Escape would close the whole dialog).
    await register.getByText('Allowed material specifications').click();
    await expect(page.getByRole('option', { name: 'ASTM F1537' })).toBeHidden();
    await register.getByLabel('Where the finished device touches the body').click();
    await page.getByRole('option', { name: 'Cerebrospinal fluid' }).click();
    await register.getByLabel('Finished length per unit (mm)').pressSequentially('18', typing);
    await register.getByLabel('Cut-off allowance per unit (mm)').pressSequentially('2', typing);
    await register.getByLabel('Lot number pattern').fill('');
    await register.getByLabel('Lot number pattern').pressSequentially('CSF{SEQ:4}', typing);
    await register.getByLabel('Step 20 method').click();
    await expect(page.getByRole('option', { name: 'A967-NITRIC-2 — not for cobalt-chromium alloy' })).toHaveAttribute(
      'aria-disabled',
      'true',
    );
    await page.getByRole('option', { name: 'A967-NITRIC-3 — firm’s own validation' }).click();
    await register.getByLabel('Step 30 method').click();
    await page.getByRole('option', { name: 'KIW-CLEAN-AQ' }).click();
    await page.screenshot({ path: 'test-results/register-part-contact-and-scope.png', fullPage: true });
    await register.getByRole('button', { name: 'Register part' }).click();
    await expect(register).toBeHidden();
    const part = page.getByRole('region', { name: `Part E2E-CSF-${suffix}` });
    await expect(part).toContainText('Body contact');
    await expect(part).toContainText('Cerebrospinal fluid');
    await expect(part).toContainText('A967-NITRIC-3');
    await part.scrollIntoViewIfNeeded();
    await page.screenshot({ path: 'test-results/part-cerebrospinal-fluid.png' });

    // Cleaning runs name both endotoxin limits, the strictest among a run's lots applying.
    await page.goto('/process-methods');
    const cleaning = page.getByRole('region', { name: 'Method KIW-CLEAN-AQ' });
    await expect(cleaning).toContainText('≤ 2.15 EU/device — cerebrospinal fluid contact');
    await expect(cleaning).toContainText('≤ 20 EU/device — blood, lymph, bone or other tissue contact');
  },
);
