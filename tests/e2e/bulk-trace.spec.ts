import { readFileSync } from 'node:fs';
import { expect, test } from '@playwright/test';
import { signInAs } from './support/sign-in';
import { expectAccessible } from './support/accessibility';

test('[E2E-BULK-TRACE] an auditor pastes a list of lots and UDIs, filters what was not found and downloads the answer', async ({
  page,
}) => {
  test.setTimeout(90_000);
  await signInAs(page, 'kiw-0401', '/lots');
  await expect(page.getByRole('heading', { level: 1, name: 'Lots' })).toBeVisible();
  const lotNumber = (await page.locator('table').getByRole('link').first().textContent())!.trim();

  await page.goto('/trace');
  await page.getByRole('tab', { name: 'Many at once' }).click();
  const list = page.getByLabel('UDIs or lot numbers');
  await list.pressSequentially(`${lotNumber}\nNO-SUCH-LOT-9\n(01)09521230000155(10)X1`, { delay: 40 });
  // Counted while typed: the bad check digit is already not readable.
  await expect(page.getByTestId('bulk-count')).toHaveText('3 line(s), 1 not readable');
  await page.getByRole('button', { name: 'Trace the list' }).click();
  await expect(page.getByTestId('bulk-summary')).toContainText('3 line(s): 1 found, 1 unknown, 1 not readable');
  const table = page.getByRole('region', { name: 'Trace many at once' }).getByRole('table');
  await expect(table.getByRole('link', { name: lotNumber, exact: true })).toBeVisible();
  await page
    .getByRole('radio', { name: 'Unknown' })
    .or(page.getByRole('button', { name: 'Unknown' }))
    .first()
    .click();
  await expect(table.locator('tbody tr')).toHaveCount(1);
  await expect(table).toContainText('NO-SUCH-LOT-9');
  await page.screenshot({ path: 'test-results/bulk-trace.png', fullPage: true });
  await expectAccessible(page, 'bulk trace');
  const [download] = await Promise.all([
    page.waitForEvent('download'),
    page.getByRole('button', { name: 'Download CSV' }).click(),
  ]);
  const csv = readFileSync((await download.path())!, 'utf8').split('\n');
  expect(csv[0]).toBe('line,asked,outcome,lot,part,status,on hold,open recalls,heats,reason');
  expect(csv).toHaveLength(4);
  expect(csv[3]).toMatch(/^3,\(01\)09521230000155\(10\)X1,not readable,/);
});
