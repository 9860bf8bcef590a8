import { expect, test } from '@playwright/test';
import { signInAs } from './support/sign-in';
import { openedDialog } from './support/dialogs';

test('[E2E-BAR-STOCK] an engineer receives a bar against a heat, cuts it, and prints its tag with a QR code', async ({
  page,
}) => {
  await signInAs(page, 'kiw-0101', '/bar-stock');
  await expect(page.getByRole('heading', { level: 1, name: 'Bar stock' })).toBeVisible();
  await page.getByRole('button', { name: 'Receive bar' }).click();
  const dialog = await openedDialog(page, 'Receive bar');
  await dialog.getByLabel('Heat', { exact: true }).click();
  await page.getByRole('option', { name: /NV-24-1162/ }).click();
  const marking = dialog.getByLabel('Heat number marked on the bar (read it off the bar; type or scan)');
  await marking.fill('NV 24 1163');
  await dialog.getByLabel('Tag (scan or type)').fill('E2E-BAR-01');
  await dialog.getByLabel('Diameter (mm)').fill('25.4');
  await dialog.getByLabel('Length (mm)').fill('2000');
  await dialog.getByLabel('Location').fill('Rack C1');
  await dialog.getByRole('button', { name: 'Receive bar' }).click();
  await expect(dialog).toContainText('The bar is marked NV 24 1163, the certificate is for heat NV-24-1162');
  await expect(dialog).toContainText('Does not match heat NV-24-1162');
  await marking.fill('NV 24 1162');
  await dialog.getByRole('button', { name: 'Receive bar' }).click();
  await expect(page.getByRole('heading', { level: 1, name: 'Bar piece E2E-BAR-01' })).toBeVisible();
  await expect(page.getByText('2000 mm remaining')).toBeVisible();
  await expect(page.getByRole('figure', { name: 'Bar tag' }).locator('svg')).toBeVisible();

  await page.getByRole('button', { name: 'Cut this piece' }).click();
  const cut = await openedDialog(page, 'Cut E2E-BAR-01');
  await cut.getByLabel('Piece A (mm)').pressSequentially('1000', { delay: 80 });
  await cut.getByLabel('Piece B (mm)').pressSequentially('9x', { delay: 80 });
  // Judged while typed: a length that is not a number, then a cut that leaves bar unaccounted for.
  await expect(cut.getByText('Write a length in mm, e.g. 412.5')).toBeVisible();
  await cut.getByLabel('Piece B (mm)').press('Backspace');
  await cut.getByLabel('Piece B (mm)').pressSequentially('00', { delay: 80 });
  await expect(cut.getByTestId('cut-check')).toHaveText(
    '100 mm of the bar is not accounted for (the kerf allowance is 3 mm); record the remnant as a piece',
  );
  await cut.getByRole('button', { name: 'Record the cut' }).click();
  await expect(cut.getByRole('alert')).toContainText(
    '100 mm of the bar is not accounted for (the kerf allowance is 3 mm)',
  );
  await cut.getByRole('button', { name: 'Add a piece' }).click();
  await cut.getByLabel('Piece C (mm)').pressSequentially('94', { delay: 80 });
  await expect(cut.getByTestId('cut-check')).toHaveText('The pieces and the kerf account for the bar.');
  await cut.getByRole('button', { name: 'Record the cut' }).click();
  await expect(cut).toBeHidden();
  await expect(page.getByText('E2E-BAR-01-A, E2E-BAR-01-B, E2E-BAR-01-C')).toBeVisible();
  await expect(page.getByText('0 mm remaining')).toBeVisible();
  await page.screenshot({ path: 'test-results/bar-piece.png', fullPage: true });
});
