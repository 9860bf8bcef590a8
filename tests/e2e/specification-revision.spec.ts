import { expect, test } from '@playwright/test';
import { signInAs } from './support/sign-in';
import { openedDialog } from './support/dialogs';

test('a QA reviewer drafts a new revision with its source, and a QA approver signs it into the library', async ({
  page,
}) => {
  await signInAs(page, 'kiw-0201', '/specifications');
  await expect(page.getByRole('heading', { level: 1, name: 'Specification library' })).toBeVisible();
  await page.getByRole('button', { name: /ASTM F1295/ }).click();
  await expect(
    page.getByRole('table', { name: 'Chemistry limits of ASTM F1295' }).or(page.locator('table').first()),
  ).toContainText('unverified — check your licensed copy');
  await page.getByRole('button', { name: 'Draft a new revision' }).click();
  const dialog = await openedDialog(page, 'Draft a new revision of ASTM F1295');
  await dialog.getByLabel('New revision').fill('L3');
  await dialog.getByLabel('Edition of the standard').fill('F1295 as in our licensed copy');
  await dialog.getByLabel('Why').fill('Tantalum limit confirmed against the licensed standard');
  await dialog.getByRole('combobox', { name: 'Element' }).fill('Ta');
  await dialog.getByLabel('Maximum', { exact: true }).fill('0.50');
  await dialog.getByLabel('Source of the value').fill('Licensed copy of ASTM F1295, Table 1');
  await dialog.getByLabel('How sure is the value').click();
  await page.getByRole('option', { name: 'published, with its citation' }).click();
  await dialog.getByRole('button', { name: 'Save the draft' }).click();
  await expect(dialog).toBeHidden();
  await expect(page.getByRole('region', { name: 'Drafted revisions' })).toContainText('ASTM F1295 L3 replacing L2');
  await expect(page.getByRole('region', { name: 'Drafted revisions' })).toContainText(
    'Ta: ≤ 0.50 → ≤ 0.50 (Licensed copy of ASTM F1295, Table 1)',
  );

  await signInAs(page, 'kiw-0301', '/specifications');
  await page.getByRole('article').filter({ hasText: 'ASTM F1295 L3' }).getByRole('button', { name: 'Approve' }).click();
  const signing = await openedDialog(page, 'Sign: Approved');
  await expect(signing).toContainText('ASTM F1295 revision L3 (replacing L2)');
  const popupOpened = page.waitForEvent('popup');
  await signing.getByRole('button', { name: 'Confirm with password and sign' }).click();
  const popup = await popupOpened;
  await popup.getByLabel('Password').fill('joaquin-demo');
  await popup.getByRole('button', { name: 'Sign in' }).click();
  await expect(signing.getByTestId('signature-manifestation')).toContainText('Joaquín Ferreira — Approved', {
    timeout: 15_000,
  });
  await signing.getByRole('button', { name: 'Done' }).click();
  await expect(page.getByRole('button', { name: /ASTM F1295/ })).toContainText('revision L3');
  await page.screenshot({ path: 'test-results/specification-library.png', fullPage: true });
});
