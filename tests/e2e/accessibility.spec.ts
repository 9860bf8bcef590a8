import { expect, test, type Page } from '@playwright/test';
import { signInAs } from './support/sign-in';
import { expectAccessible } from './support/accessibility';

// Every screen, as the role that works on it sees it, checked by axe-core for serious and critical
// WCAG 2.1 A/AA violations. Detail screens are reached by following the first row of their list.
async function visit(page: Page, path: string, heading: string | RegExp) {
  await page.goto(path);
  await expect(page.getByRole('heading', { level: 1, name: heading })).toBeVisible();
  // Let lists finish loading before judging them.
  await expect(page.locator('.p-datatable-mask, .p-progressspinner')).toHaveCount(0, { timeout: 15_000 });
  await expectAccessible(page, path);
}

async function followFirst(page: Page, list: string, heading: RegExp) {
  await page.goto(list);
  const link = page.locator('main table a, main .p-datatable a').first();
  await expect(link).toBeVisible({ timeout: 15_000 });
  await link.click();
  await expect(page.getByRole('heading', { level: 1, name: heading })).toBeVisible();
  await expect(page.locator('.p-datatable-mask, .p-progressspinner')).toHaveCount(0, { timeout: 15_000 });
  await expectAccessible(page, `${list} → first row`);
}

test('[E2E-AXE-SCREENS] every screen has no serious or critical accessibility violation', async ({ page }) => {
  test.setTimeout(180_000);
  await page.goto('/sign-in');
  await expect(page.getByRole('heading', { level: 1, name: 'Sign in' })).toBeVisible();
  await expectAccessible(page, '/sign-in');

  await signInAs(page, 'kiw-0301', '/');
  await expect(page.getByRole('heading', { level: 1 }).first()).toBeVisible();
  await expectAccessible(page, '/ (QA approver)');
  await visit(page, '/heats', 'Heats and certificates');
  await followFirst(page, '/heats', /^Heat /);
  await visit(page, '/suppliers', 'Suppliers');
  await followFirst(page, '/suppliers', /./);
  await visit(page, '/specifications', /Specification/);
  await visit(page, '/bar-stock', 'Bar stock');
  await followFirst(page, '/bar-stock', /^Bar piece /);
  await visit(page, '/lots', 'Lots');
  await followFirst(page, '/lots', /^Lot /);
  await visit(page, '/parts', 'Parts and routings');
  await visit(page, '/consignees', 'Consignees');
  await visit(page, '/process-runs', /Process runs/);
  await followFirst(page, '/process-runs', /run/);
  await visit(page, '/process-methods', 'Process methods');
  await visit(page, '/nonconformances', 'Nonconformances');
  await followFirst(page, '/nonconformances', /^NC-/);
  await visit(page, '/release', 'Release desk');
  await followFirst(page, '/release', /^Lot /);

  await signInAs(page, 'kiw-0501', '/trace');
  await expect(page.getByRole('heading', { level: 1, name: 'Trace and recall' })).toBeVisible();
  await expectAccessible(page, '/trace');
  await visit(page, '/recalls', 'Recall investigations');
  await followFirst(page, '/recalls', /^(Recall|Drill)/);

  await signInAs(page, 'kiw-0401', '/audit');
  await expect(page.getByRole('heading', { level: 1, name: 'Audit trail' })).toBeVisible();
  await expect(page.locator('.p-datatable-mask')).toHaveCount(0, { timeout: 15_000 });
  await expectAccessible(page, '/audit');

  await signInAs(page, 'kiw-0601', '/administration');
  await expect(page.getByRole('heading', { level: 1 }).first()).toBeVisible();
  await expect(page.locator('.p-datatable-mask')).toHaveCount(0, { timeout: 15_000 });
  await expectAccessible(page, '/administration');
});
