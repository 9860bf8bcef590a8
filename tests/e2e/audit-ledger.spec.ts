import { expect, test } from '@playwright/test';
import { signInAs } from './support/sign-in';
import { openedDialog } from './support/dialogs';

test('[E2E-LEDGER] an auditor filters the audit trail, runs the verification and signs a review of the trail', async ({
  page,
}) => {
  await signInAs(page, 'kiw-0401', '/audit');
  await expect(page.getByRole('heading', { level: 1, name: 'Audit trail' })).toBeVisible();
  const table = page.getByRole('table');
  await expect(table.getByRole('row').nth(1)).toBeVisible();

  // Filter by event and person; events are named in words, never by their stored code.
  await page.getByLabel('Event', { exact: true }).click();
  await page.getByRole('option', { name: 'Signed in', exact: true }).click();
  await page.getByLabel('Who').fill('Priya');
  await expect(table.getByRole('row').nth(1)).toContainText('Signed in');
  await expect(table.getByRole('row').nth(1)).not.toContainText('session.signed-in');
  await expect(table.getByRole('row').nth(1)).toContainText('Priya Raghunathan');
  // Every row but the header is Priya's sign-in.
  await expect(table.getByRole('row').filter({ hasNotText: 'Priya Raghunathan' })).toHaveCount(1);

  // Open one event and follow the record's history.
  await table.getByRole('row').nth(1).getByRole('button').first().click();
  await expect(page.getByText('Previous hash')).toBeVisible();
  await page.getByRole('button', { name: /^History of person \d+$/ }).click();
  await expect(page.getByRole('heading', { name: /^History of person \d+, oldest first$/ })).toBeVisible();
  await expect(table.getByRole('row').nth(1)).toContainText('Person added at first sign-in');
  await page.screenshot({ path: 'test-results/audit-history.png', fullPage: true });

  // The verifiable bundle downloads through a POST that carries the CSRF token.
  const download = page.waitForEvent('download');
  await page.getByRole('button', { name: 'Export verifiable bundle' }).click();
  expect((await download).suggestedFilename()).toMatch(/^ingotrace-ledger-export-\d+\.json$/);

  // Verify the chain.
  await page.getByRole('button', { name: 'Verify the chain' }).click();
  await expect(page.getByTestId('verification-result')).toContainText(
    /audit trail verified: \d+ events, \d+ signatures, chain head \d+ [0-9a-f]{64}/,
  );

  // Sign a review of the trail: the identity provider asks for the password again in a small window.
  await page.getByRole('button', { name: 'Sign the review of this trail' }).click();
  const dialog = await openedDialog(page, 'Sign: Reviewed');
  await expect(dialog.getByTestId('signature-statement')).toContainText(
    'legally binding equivalent of my handwritten signature',
  );
  await expect(dialog.getByText(/^Audit trail reviewed through event \d+$/)).toBeVisible();
  await page.screenshot({ path: 'test-results/signing-dialog.png' });
  const popupOpened = page.waitForEvent('popup');
  await dialog.getByRole('button', { name: 'Confirm with password and sign' }).click();
  const popup = await popupOpened;
  await expect(popup.getByRole('heading', { name: 'Confirm it is you' })).toBeVisible();
  await popup.getByLabel('Password').fill('priya-demo');
  await popup.getByRole('button', { name: 'Sign in' }).click();
  await expect(dialog.getByTestId('signature-manifestation')).toContainText(
    /Signed: Priya Raghunathan — Reviewed — \d{4}-\d{2}-\d{2} \d{2}:\d{2}:\d{2} (GMT|BST)/,
    { timeout: 15_000 },
  );
  await dialog.getByRole('button', { name: 'Done' }).click();
  await expect(page.getByRole('list', { name: 'Signatures' })).toContainText('Priya Raghunathan — Reviewed');
  await page.screenshot({ path: 'test-results/audit-signed-review.png', fullPage: true });
});
