import { expect, test, type Page } from '@playwright/test';
import { signInAs } from './support/sign-in';
import { expectAccessible } from './support/accessibility';

/** Presses Tab until the focused element is the one named (as a keyboard user moves), at most 80 times. */
async function tabTo(page: Page, name: string) {
  for (let presses = 0; presses < 80; presses++) {
    await page.keyboard.press('Tab');
    const focused = await page.evaluate(() => {
      const element = document.activeElement as HTMLElement | null;
      return element ? (element.getAttribute('aria-label') ?? element.textContent ?? '').trim() : '';
    });
    if (focused === name) return;
  }
  throw new Error(`"${name}" was not reached with the Tab key`);
}

const focusedName = (page: Page) =>
  page.evaluate(() => ((document.activeElement as HTMLElement | null)?.textContent ?? '').trim());

test(
  '[E2E-SIGN-KEYBOARD] a person signs by keyboard alone, ' + 'and focus returns to the button that opened the dialog',
  async ({ page }) => {
    test.setTimeout(120_000);
    await signInAs(page, 'kiw-0401', '/audit');
    await expect(page.getByRole('heading', { level: 1, name: 'Audit trail' })).toBeVisible();

    await tabTo(page, 'Verify the chain');
    await page.keyboard.press('Enter');
    await expect(page.getByTestId('verification-result')).toContainText('audit trail verified');

    // Opened and closed with the keyboard: focus comes back to the opener.
    await tabTo(page, 'Sign the review of this trail');
    await page.keyboard.press('Enter');
    const dialog = page.getByRole('dialog', { name: 'Sign: Reviewed' });
    await expect(dialog).toBeVisible();
    await expect(dialog.getByTestId('signature-signer')).toContainText('Signed by Priya Raghunathan');
    // Name, meaning, date and time as the signature will read, before the password step (21 CFR 11.50).
    await expect(dialog.getByTestId('signature-preview')).toContainText(
      /Your signature will read: Priya Raghunathan — Reviewed — \d{4}-\d{2}-\d{2} \d{2}:\d{2}/,
    );
    await expect(dialog.getByTestId('signature-preview')).toContainText('times in Europe/London');
    await expectAccessible(page, 'signing dialog');
    await page.keyboard.press('Escape');
    await expect(dialog).toBeHidden();
    await expect.poll(() => focusedName(page)).toBe('Sign the review of this trail');

    // Signed with the keyboard, the password typed in the identity provider's window after a pause.
    await page.keyboard.press('Enter');
    await expect(dialog).toBeVisible();
    await tabTo(page, 'Confirm with password and sign');
    const popupOpened = page.waitForEvent('popup');
    await page.keyboard.press('Enter');
    const popup = await popupOpened;
    await expect(popup.getByRole('heading', { name: 'Confirm it is you' })).toBeVisible();
    await popup.waitForTimeout(4_000);
    await popup.getByLabel('Password').focus();
    await popup.keyboard.type('priya-demo', { delay: 120 });
    await popup.keyboard.press('Enter');
    await expect(dialog.getByTestId('signature-manifestation')).toContainText('Signed: Priya Raghunathan — Reviewed', {
      timeout: 20_000,
    });
    await tabTo(page, 'Done');
    await page.keyboard.press('Enter');
    await expect(dialog).toBeHidden();
    await expect.poll(() => focusedName(page)).toBe('Sign the review of this trail');
    await page.screenshot({ path: 'test-results/signed-by-keyboard.png' });
  },
);
