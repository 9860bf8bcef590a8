import { expect, test } from '@playwright/test';
import { demoPeople } from '../../scripts/stand-in-idp/demo-people';
import { signInAs } from './support/sign-in';
import { openedDialog } from './support/dialogs';

test('[E2E-PEOPLE] an administrator finds a person, changes their roles with a reason, and deactivates and reactivates them', async ({ page }) => {
  await signInAs(page, 'kiw-0601', '/administration');
  await expect(page.getByRole('heading', { level: 1, name: 'People and roles' })).toBeVisible();
  const table = page.getByRole('table');
  await expect(table.getByRole('row')).toHaveCount(demoPeople.length + 1); // the header and every demo person
  await page.getByLabel('Search people').fill('Wiśniewski');
  await expect(table.getByRole('row')).toHaveCount(2);
  await page.screenshot({ path: 'test-results/people-search.png', fullPage: true });

  await page.getByRole('button', { name: 'Change roles of Tomasz Wiśniewski' }).click();
  const dialog = await openedDialog(page, 'Roles of Tomasz Wiśniewski');
  await dialog.getByLabel('Recall coordinator').check();
  await dialog.getByRole('button', { name: 'Save roles' }).click();
  await expect(dialog.getByText('Give a reason of at least 3 characters')).toBeVisible();
  await dialog.getByLabel('Reason for the change').fill('Covers recall drills in December');
  await page.screenshot({ path: 'test-results/people-roles-dialog.png' });
  await dialog.getByRole('button', { name: 'Save roles' }).click();
  await expect(dialog).toBeHidden();
  await expect(table.getByRole('row').nth(1)).toContainText('Recall coordinator');

  await page.getByRole('button', { name: 'Change roles of Tomasz Wiśniewski' }).click();
  await dialog.getByLabel('Recall coordinator').uncheck();
  await dialog.getByLabel('Reason for the change').fill('Drill cover ended');
  await dialog.getByRole('button', { name: 'Save roles' }).click();
  await expect(dialog).toBeHidden();

  await page.getByRole('button', { name: 'Deactivate Tomasz Wiśniewski' }).click();
  const confirm = await openedDialog(page, 'Deactivate Tomasz Wiśniewski?');
  await confirm.getByLabel('Reason').fill('On long leave');
  await confirm.getByRole('button', { name: 'Deactivate' }).click();
  await expect(table.getByRole('row').nth(1)).toContainText('Deactivated');
  await page.getByRole('button', { name: 'Reactivate Tomasz Wiśniewski' }).click();
  await page.getByRole('dialog', { name: 'Reactivate Tomasz Wiśniewski?' }).getByLabel('Reason').fill('Back from leave');
  await page.getByRole('dialog', { name: 'Reactivate Tomasz Wiśniewski?' }).getByRole('button', { name: 'Reactivate' }).click();
  await expect(table.getByRole('row').nth(1)).toContainText('Active');
});
