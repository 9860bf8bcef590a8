import { expect, type Page } from '@playwright/test';

/**
 * Completes an open signing dialog as a person would: optional reason, password again at the
 * identity provider's pop-up, then waits for the signature's manifestation and closes the dialog.
 */
export async function signWithPassword(
  page: Page,
  meaningLabel: string,
  manifestation: string,
  password: string,
  reason?: string,
  keystrokeDelayMs = 0,
): Promise<void> {
  const signing = page.getByRole('dialog', { name: `Sign: ${meaningLabel}` });
  if (reason)
    await (keystrokeDelayMs
      ? signing.getByLabel(/^Reason/).pressSequentially(reason, { delay: keystrokeDelayMs })
      : signing.getByLabel(/^Reason/).fill(reason));
  const popupOpened = page.waitForEvent('popup');
  await signing.getByRole('button', { name: 'Confirm with password and sign' }).click();
  const popup = await popupOpened;
  await (keystrokeDelayMs
    ? popup.getByLabel('Password').pressSequentially(password, { delay: keystrokeDelayMs })
    : popup.getByLabel('Password').fill(password));
  await popup.getByRole('button', { name: 'Sign in' }).click();
  await expect(signing.getByTestId('signature-manifestation')).toContainText(manifestation, { timeout: 15_000 });
  await signing.getByRole('button', { name: 'Done' }).click();
}
