import { expect, test } from '@playwright/test';
import { permissionMatrix } from '../../shared/auth/permissions';
import { roleLabels, roles } from '../../shared/auth/roles';
import { productAreas } from '../../src/navigation/areas';
import { bySingleRole } from '../helpers/saml-round-trip';
import { signInAs, signOut } from './support/sign-in';

for (const role of roles) {
  test(
    `[E2E-SIGN-IN] a ${roleLabels[role]} signs in through the identity provider, sees that role's menus and ` +
      `signs out`,
    async ({ page }) => {
      await signInAs(page, bySingleRole[role]);
      await expect(page.getByRole('heading', { level: 1, name: 'Overview' })).toBeVisible();
      await expect(page.getByTestId('signed-in-person')).toContainText(roleLabels[role]);
      const expected = [
        'Overview',
        ...productAreas.filter((area) => permissionMatrix[role].includes(area.action)).map((area) => area.title),
      ];
      await expect(page.getByRole('navigation', { name: 'Product areas' }).getByRole('link')).toHaveText(expected);
      await signOut(page);
      await page.goto('/');
      await expect(page.getByRole('heading', { level: 1, name: 'Sign in' })).toBeVisible();
    },
  );
}

test(
  '[E2E-DEACTIVATED] a deactivated person is refused with ' + 'the reason, and a forbidden area says not permitted',
  async ({ page }) => {
    await signInAs(page, 'kiw-0901');
    const refusal = page.getByRole('alert');
    await expect(refusal).toContainText('Sign-in refused: Your Ingotrace account is deactivated');
    // The message opens with an animation; the screenshot waits until it shows its text.
    await expect.poll(async () => (await refusal.boundingBox())?.height ?? 0).toBeGreaterThan(24);
    await page.screenshot({ path: 'test-results/sign-in-refused.png' });

    await signInAs(page, 'kiw-0101', '/administration');
    await expect(page.getByRole('heading', { level: 1, name: 'Not permitted' })).toBeVisible();
  },
);
