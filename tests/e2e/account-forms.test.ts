// The account page's password form through real Chromium with JavaScript off (a plain HTML form
// posting to an Astro Action): a wrong current password is shown at its field, then a change
// goes through and the new password signs in.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { BASE } from '../helpers/api-client';
import { launchBrowser } from '../helpers/browser';
import { PASSWORD, signUpMember } from '../helpers/mail-flow';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(() => browser?.close());

async function signIn(page: Page, email: string, password: string) {
  await page.goto(BASE() + '/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((url) => url.pathname !== '/sign-in');
}

describe('changing the password on the account page', () => {
  it('shows a wrong current password at its field, then changes it', async () => {
    const { email } = await signUpMember('pwform');
    const context = await browser.newContext({ javaScriptEnabled: false });
    const page = await context.newPage();
    await signIn(page, email, PASSWORD);
    await page.goto(BASE() + '/account');
    const form = page.locator('section[aria-labelledby="pw-title"] form');
    await form.getByLabel('Current password').fill('not my password');
    await form.getByLabel('New password').fill('another long password');
    await form.getByRole('button', { name: 'Change password' }).click();
    const error = page.locator('[data-field-error="currentPassword"]');
    await error.waitFor();
    expect((await error.textContent())?.length).toBeGreaterThan(0);

    await form.getByLabel('Current password').fill(PASSWORD);
    await form.getByLabel('New password').fill('another long password');
    await form.getByRole('button', { name: 'Change password' }).click();
    await page.getByRole('status').filter({ hasText: 'Password changed.' }).waitFor();
    await context.close();

    const fresh = await (await browser.newContext({ javaScriptEnabled: false })).newPage();
    await signIn(fresh, email, 'another long password');
    expect(new URL(fresh.url()).pathname).toBe('/library');
    await fresh.context().close();
  });
});
