import { expect, test } from '@playwright/test';
import { signInAs } from './support/sign-in';
import { signWithPassword } from './support/signing';

test('[E2E-RELEASE] a QA reviewer and then a different QA approver sign a submitted lot, which is released', async ({
  page,
}) => {
  test.setTimeout(90_000);
  await signInAs(page, 'kiw-0201', '/release');
  await expect(page.getByRole('heading', { level: 1, name: 'Release desk' })).toBeVisible();
  await page.getByRole('tab', { name: /^Awaiting review/ }).click();
  const queue = page.locator('table');
  const first = queue.getByRole('link').first();
  const lotNumber = (await first.textContent())!.trim();
  await first.click();
  await expect(page.getByRole('heading', { level: 1, name: new RegExp(`^Lot ${lotNumber}`) })).toBeVisible();
  const checklist = page.getByRole('list', { name: 'Release checklist' });
  await expect(checklist.getByRole('listitem')).toHaveCount(10);
  await expect(checklist.locator('.fail')).toHaveCount(0);
  await page.getByRole('button', { name: 'Show the release content' }).click();
  // The release content reads as a document: named sections and columns, times on the plant clock.
  const content = page.getByTestId('signed-content');
  await expect(content.getByRole('columnheader', { name: 'Certificate SHA-256' })).toBeVisible();
  await expect(content).toContainText('Dates and times: times in Europe/London');
  await expect(content).not.toContainText('inWindow');
  const trail = page.getByRole('region', { name: 'Audit trail' });
  await expect(trail).toContainText('The reviewer’s signature will record that they reviewed them');
  await trail.getByRole('button', { name: 'Show the audit trail' }).click();
  await expect(trail.getByRole('list', { name: 'Audit trail events' })).toContainText('Lot submitted for release');
  await expect(trail.getByRole('list', { name: 'Audit trail events' })).not.toContainText('lot.submitted-for-release');
  await page.screenshot({ path: 'test-results/release-audit-trail.png', fullPage: true });
  await page.getByRole('button', { name: 'Sign as reviewed' }).click();
  await expect(page.getByRole('dialog', { name: 'Sign: Reviewed' })).toContainText('Release of lot');
  await expect(page.getByTestId('signature-trail')).toContainText(
    /covers the record's audit trail as it stands now: \d+ events, through event #\d+/,
  );
  await page.getByTestId('signature-trail').scrollIntoViewIfNeeded();
  await page
    .getByRole('dialog', { name: 'Sign: Reviewed' })
    .screenshot({ path: 'test-results/release-review-dialog.png' });
  await signWithPassword(page, 'Reviewed', 'Aisling Ní Bhriain — Reviewed', 'aisling-demo');
  await expect(page.getByRole('heading', { level: 1, name: new RegExp(`^Lot ${lotNumber}`) })).toContainText(
    'Reviewed',
  );
  await expect(page.getByRole('button', { name: 'Approve for release' })).toHaveCount(0);

  await signInAs(page, 'kiw-0301', '/release');
  // Each tab counts its lots; awaiting approval names who reviewed each lot.
  await expect(page.getByRole('tab', { name: /^Awaiting approval \d+/ })).toBeVisible();
  await page.getByRole('tab', { name: /^Awaiting approval/ }).click();
  await expect(page.locator('table').getByRole('row', { name: new RegExp(lotNumber) })).toContainText(
    'Aisling Ní Bhriain',
  );
  await page.screenshot({ path: 'test-results/release-desk-approval.png', fullPage: true });
  await page.locator('table').getByRole('link', { name: lotNumber }).click();
  await page.getByRole('button', { name: 'Approve for release' }).click();
  await expect(page.getByRole('dialog', { name: 'Sign: Approved for release' })).toContainText('Release of lot');
  await signWithPassword(page, 'Approved for release', 'Joaquín Ferreira — Approved for release', 'joaquin-demo');
  await expect(page.getByRole('heading', { level: 1, name: new RegExp(`^Lot ${lotNumber}`) })).toContainText(
    'Released',
  );
  await expect(page.getByRole('region', { name: /^Release (checklist passes|not ready)$/ })).toContainText(
    'Joaquín Ferreira — Approved for release',
  );
  const downloading = page.waitForEvent('download');
  await page.getByRole('link', { name: 'Download the release packet (PDF)' }).click();
  const download = await downloading;
  expect(download.suggestedFilename()).toBe(`release-packet-${lotNumber}.pdf`);
  const bytes = await (await download.createReadStream()).toArray();
  expect(Buffer.concat(bytes).subarray(0, 5).toString()).toBe('%PDF-');
  await page.screenshot({ path: 'test-results/lot-released.png', fullPage: true });

  // Shipping more than is released is flagged while the quantity is typed.
  await signInAs(page, 'kiw-0102', '/lots');
  await expect(page.getByRole('heading', { level: 1, name: 'Lots' })).toBeVisible();
  await page.getByLabel('Search lots').pressSequentially(lotNumber, { delay: 60 });
  await page.getByRole('link', { name: lotNumber, exact: true }).click();
  await page.getByRole('button', { name: 'Record a shipment' }).click();
  const ship = page.getByRole('dialog', { name: /Ship/ });
  await ship.getByLabel('Units').pressSequentially('99999', { delay: 80 });
  await expect(ship.getByTestId('ship-qty-problem')).toHaveText(/^Only \d+ released units? (is|are) not yet shipped$/);
  await ship.screenshot({ path: 'test-results/ship-too-many.png' });
  await ship.getByRole('button', { name: 'Cancel' }).click();
});
