import { expect, type Locator, type Page } from '@playwright/test';

/**
 * A dialog once it has finished opening. PrimeVue moves the focus into a dialog when its opening
 * animation ends; on a busy machine that can come after the first keystrokes, which would then
 * land in whichever field the focus moves to. Waiting for the focus to arrive first is what a
 * person does without thinking.
 */
export async function openedDialog(page: Page, name: string | RegExp): Promise<Locator> {
  const dialog = page.getByRole('dialog', { name });
  await expect(dialog).toBeVisible();
  // The transition's classes go, and the focus moves in, in the same task when the animation ends.
  await expect(dialog).not.toHaveClass(/-enter-/);
  await expect(dialog.locator(':focus')).toHaveCount(1);
  return dialog;
}
