import { expect, type Page } from '@playwright/test';
import { demoPeople } from '../../../scripts/stand-in-idp/demo-people';

/** Signs in through the stand-in identity provider's own page, as a person would. */
export async function signInAs(page: Page, subject: string, startAt = '/'): Promise<void> {
  const person = demoPeople.find((candidate) => candidate.subject === subject);
  if (!person) throw new Error(`no demo person ${subject}`);
  // A fresh browser: no session here, none at the identity provider.
  await page.context().clearCookies();
  await page.goto(startAt);
  await expect(page.getByRole('heading', { level: 1, name: 'Sign in' })).toBeVisible();
  await page.getByRole('link', { name: 'Sign in with your organisation account' }).click();
  await expect(page.getByRole('heading', { name: 'Sign in to Ingotrace' })).toBeVisible();
  await page.getByLabel('Person').selectOption(person.subject);
  await page.getByLabel('Password').fill(person.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

export async function signOut(page: Page): Promise<void> {
  await page.getByRole('button', { name: 'Sign out' }).click();
  await expect(page.getByRole('heading', { level: 1, name: 'You are signed out' })).toBeVisible();
}
