import { expect, test } from '@playwright/test';
import { demoPeople } from '../../scripts/stand-in-idp/demo-people';
import { signInAs } from './support/sign-in';
import { openedDialog } from './support/dialogs';
import { signWithPassword } from './support/signing';

test(
  '[E2E-PEOPLE] an administrator finds a person, asks for a signing role that a second administrator confirms ' +
    'by signature, and deactivates and reactivates them',
  async ({ page }) => {
    test.setTimeout(120_000);
    await signInAs(page, 'kiw-0601', '/administration');
    await expect(page.getByRole('heading', { level: 1, name: 'People and roles' })).toBeVisible();
    const table = page.getByRole('table');
    await expect(table.getByRole('row')).toHaveCount(demoPeople.length + 1); // the header and every demo person
    await page.getByLabel('Search people').fill('Wierzchlas');
    await expect(table.getByRole('row')).toHaveCount(2);
    await page.screenshot({ path: 'test-results/people-search.png', fullPage: true });

    // Nobody changes their own roles: the administrator's own row offers no role change.
    await expect(page.getByRole('button', { name: 'Change roles of Helmer Dalvang' })).toHaveCount(0);
    await page.getByLabel('Search people').fill('Wierzchlas');

    // A signing role is asked for by one administrator...
    await page.getByRole('button', { name: 'Change roles of Tobiasz Wierzchlas' }).click();
    const dialog = await openedDialog(page, 'Roles of Tobiasz Wierzchlas');
    await dialog.getByLabel('Recall coordinator').check();
    await expect(dialog.getByText('it takes effect only once a second administrator confirms it')).toBeVisible();
    await dialog.getByRole('button', { name: 'Ask for confirmation' }).click();
    await expect(dialog.getByText('Give a reason of at least 3 characters')).toBeVisible();
    await dialog
      .getByLabel('Reason for the change')
      .pressSequentially('Covers recall drills in December', { delay: 40 });
    await page.screenshot({ path: 'test-results/people-roles-dialog.png' });
    await dialog.getByRole('button', { name: 'Ask for confirmation' }).click();
    await expect(dialog).toBeHidden();
    const waiting = page.getByRole('region', { name: 'Signing roles waiting for confirmation' });
    await expect(waiting).toContainText('Tobiasz Wierzchlas');
    await expect(waiting).toContainText('Another administrator confirms this');
    await expect(table.getByRole('row').nth(1)).not.toContainText('Recall coordinator');
    await page.screenshot({ path: 'test-results/people-role-change-waiting.png', fullPage: true });

    // ...and takes effect when a second administrator confirms it with an electronic signature.
    await signInAs(page, 'kiw-0602', '/administration');
    await page
      .getByRole('region', { name: 'Signing roles waiting for confirmation' })
      .getByRole('button', { name: 'Confirm the role change for Tobiasz Wierzchlas' })
      .click();
    const signing = await openedDialog(page, 'Sign: Role change confirmed');
    await expect(signing).toContainText('Covers recall drills in December');
    await signWithPassword(page, 'Role change confirmed', 'Mirela Vasilescu — Role change confirmed', 'mirela-demo');
    await page.getByLabel('Search people').fill('Wierzchlas');
    await expect(table.getByRole('row').nth(1)).toContainText('Recall coordinator');
    await expect(page.getByText('No role change is waiting.')).toBeVisible();
    await page.screenshot({ path: 'test-results/people-role-change-confirmed.png', fullPage: true });

    // Taking it away again is asked by this administrator and confirmed by the first.
    await page.getByRole('button', { name: 'Change roles of Tobiasz Wierzchlas' }).click();
    await dialog.getByLabel('Recall coordinator').uncheck();
    await dialog.getByLabel('Reason for the change').pressSequentially('Drill cover ended', { delay: 40 });
    await dialog.getByRole('button', { name: 'Ask for confirmation' }).click();
    await expect(dialog).toBeHidden();
    await signInAs(page, 'kiw-0601', '/administration');
    await page
      .getByRole('region', { name: 'Signing roles waiting for confirmation' })
      .getByRole('button', { name: 'Confirm the role change for Tobiasz Wierzchlas' })
      .click();
    await signWithPassword(page, 'Role change confirmed', 'Helmer Dalvang — Role change confirmed', 'helmer-demo');
    await page.getByLabel('Search people').fill('Wierzchlas');
    await expect(table.getByRole('row').nth(1)).not.toContainText('Recall coordinator');

    await page.getByRole('button', { name: 'Deactivate Tobiasz Wierzchlas' }).click();
    const confirm = await openedDialog(page, 'Deactivate Tobiasz Wierzchlas?');
    await confirm.getByLabel('Reason').fill('On long leave');
    await confirm.getByRole('button', { name: 'Deactivate' }).click();
    await expect(table.getByRole('row').nth(1)).toContainText('Deactivated');
    await page.getByRole('button', { name: 'Reactivate Tobiasz Wierzchlas' }).click();
    await page
      .getByRole('dialog', { name: 'Reactivate Tobiasz Wierzchlas?' })
      .getByLabel('Reason')
      .fill('Back from leave');
    await page
      .getByRole('dialog', { name: 'Reactivate Tobiasz Wierzchlas?' })
      .getByRole('button', { name: 'Reactivate' })
      .click();
    await expect(table.getByRole('row').nth(1)).toContainText('Active');
  },
);
