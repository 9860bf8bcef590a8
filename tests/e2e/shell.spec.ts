import { expect, test } from '@playwright/test';
import { signInAs } from './support/sign-in';

const areas = [
  { link: 'Production lots', path: '/lots', caution: true },
  { link: 'Process runs', path: '/process-runs', caution: false },
  { link: 'Release desk', path: '/release', caution: true },
  { link: 'Trace and recall', path: '/trace', caution: false },
];

test('the shell loads with the firm, the system status and every area', async ({ page }) => {
  const errors: string[] = [];
  page.on('pageerror', (error) => errors.push(error.message));
  await signInAs(page, 'kiw-0401');
  await expect(page.getByRole('heading', { level: 1, name: 'Overview' })).toBeVisible();
  await expect(page.getByTestId('organisation-name')).toHaveText(/Kestrelmoor Implant Works/);
  await expect(page.getByTestId('signed-in-person')).toContainText('Priya Raghunathan');
  await expect(page.getByTestId('system-status')).toHaveText('Running');
  await page.screenshot({ path: 'test-results/shell-overview.png', fullPage: true });

  const rail = page.getByRole('navigation', { name: 'Product areas' });
  for (const area of areas) {
    await rail.getByRole('link', { name: area.link }).click();
    await expect(page).toHaveURL(area.path);
    await expect(page.getByRole('heading', { level: 1, name: area.link })).toBeVisible();
    await expect(page.getByRole('note', { name: 'Regulated release caution' })).toHaveCount(area.caution ? 1 : 0);
    await expect(page).toHaveTitle(`${area.link} · Ingotrace`);
  }
  expect(errors).toEqual([]);
});

test('a deep link survives the sign-in, and an unknown address says so', async ({ page }) => {
  await signInAs(page, 'kiw-0301', '/release');
  await expect(page).toHaveURL('/release');
  await expect(page.getByRole('heading', { level: 1, name: 'Release desk' })).toBeVisible();
  await expect(page.getByRole('note', { name: 'Regulated release caution' })).toContainText(
    'Regulated release rests with your quality system',
  );
  await page.screenshot({ path: 'test-results/shell-release.png', fullPage: true });

  await page.goto('/no/such/page');
  await expect(page.getByRole('heading', { level: 1, name: 'Page not found' })).toBeVisible();
  await page.getByRole('link', { name: 'Go to the overview' }).click();
  await expect(page.getByRole('heading', { level: 1, name: 'Overview' })).toBeVisible();
});

test('the navigation works from the keyboard', async ({ page }) => {
  await signInAs(page, 'kiw-0101');
  await expect(page.getByRole('heading', { level: 1, name: 'Overview' })).toBeVisible();
  await page.keyboard.press('Tab');
  await expect(page.getByRole('link', { name: 'Skip to content' })).toBeFocused();
  const lots = page.getByRole('navigation', { name: 'Product areas' }).getByRole('link', { name: 'Production lots' });
  await lots.focus();
  await page.keyboard.press('Enter');
  await expect(page).toHaveURL('/lots');
});
