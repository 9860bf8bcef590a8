import { expect, test, type Page } from '@playwright/test';
import { signInAs } from './support/sign-in';
import { expectAccessible } from './support/accessibility';

test(
  '[E2E-HOME] a QA approver’s home lists what waits for them, with counts and links, and the plant’s figures as ' +
    'charts',
  async ({ page }) => {
    await signInAs(page, 'kiw-0301', '/');
    await expect(page.getByRole('heading', { level: 1, name: 'Overview' })).toBeVisible();
    const toApprove = page.getByTestId('work-lots-to-approve');
    await expect(toApprove).toContainText('Lots to approve for release');
    const shown = Number((await toApprove.locator('.count').textContent())!.trim());
    expect(shown).toBeGreaterThan(0);
    await expect(page.getByRole('heading', { level: 2, name: /^The plant since/ })).toBeVisible();
    await expect(page.getByRole('figure', { name: 'First-pass yield by part' }).getByRole('table')).toBeVisible();
    await expectAccessible(page, 'home (QA approver)');
    await page.screenshot({ path: 'test-results/home-approver.png', fullPage: true });
    await toApprove.click();
    await expect(page.getByRole('heading', { level: 1, name: 'Release desk' })).toBeVisible();
    // The count on the home is the count on the release desk's tab.
    await expect(page.getByRole('tab', { name: new RegExp(`^Awaiting approval ${shown}`) })).toBeVisible();
  },
);

test('[E2E-HOME-ENGINEER] an engineer’s home shows engineering work, not QA’s', async ({ page }) => {
  await signInAs(page, 'kiw-0102', '/');
  await expect(page.getByRole('heading', { level: 1, name: 'Overview' })).toBeVisible();
  await expect(page.getByTestId('work-lots-in-work')).toBeVisible();
  await expect(page.getByTestId('work-lots-to-approve')).toHaveCount(0);
  await expect(page.getByTestId('work-lots-to-review')).toHaveCount(0);
});

async function noSidewaysScroll(page: Page, screen: string) {
  await expect(page.getByRole('heading', { level: 1 }).first()).toBeVisible();
  await page.waitForTimeout(300);
  const overflow = await page.evaluate(
    () => document.documentElement.scrollWidth - document.documentElement.clientWidth,
  );
  expect.soft(overflow, `${screen} scrolls sideways by ${overflow} px at phone width`).toBeLessThanOrEqual(0);
}

test('[E2E-PHONE-WIDTH] at 390 px wide the main screens do not scroll sideways', async ({ page }) => {
  test.setTimeout(90_000);
  await page.setViewportSize({ width: 390, height: 844 });
  await signInAs(page, 'kiw-0301', '/');
  await noSidewaysScroll(page, 'home');
  await page.screenshot({ path: 'test-results/phone-home.png', fullPage: true });
  for (const path of ['/lots', '/heats', '/release', '/trace', '/nonconformances', '/bar-stock', '/process-runs']) {
    await page.goto(path);
    await noSidewaysScroll(page, path);
  }
  await page.goto('/lots');
  await page.locator('main table a').first().click();
  await noSidewaysScroll(page, 'lot detail');
  await page.screenshot({ path: 'test-results/phone-lot.png', fullPage: true });
});
