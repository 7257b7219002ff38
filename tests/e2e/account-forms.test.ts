// The account page's password form through real Chromium with JavaScript off (a plain HTML form
// posting to an Astro Action): a wrong current password is shown at its field, then a change
// goes through and the new password signs in.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { BASE } from '../helpers/api-client';
import { launchBrowser } from '../helpers/browser';
import { freshEmail, PASSWORD, signUpMember } from '../helpers/mail-flow';
import { signInThroughForm } from '../helpers/role-pages';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(() => browser?.close());

describe('changing the password on the account page', () => {
  it('shows a wrong current password at its field, then changes it', async () => {
    const { email } = await signUpMember('pwform');
    const context = await browser.newContext({ javaScriptEnabled: false });
    const page = await context.newPage();
    await signInThroughForm(page, email, PASSWORD);
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
    await signInThroughForm(fresh, email, 'another long password');
    expect(new URL(fresh.url()).pathname).toBe('/s/fernhill/library');
    await fresh.context().close();
  });
});

// The account-entry forms post to Astro Actions: a refused post stays on the page under the
// action's URL with the message at its field; a successful one redirects as before.
describe('the account-entry forms without JavaScript', () => {
  it('signs up after a short password is shown at its field, keeping name and e-mail, then signs in', async () => {
    const context = await browser.newContext({ javaScriptEnabled: false });
    const page = await context.newPage();
    const email = freshEmail('formjoin');
    await page.goto(BASE() + '/sign-up');
    await page.getByLabel('Your name').fill('Form Joiner');
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password').fill('short');
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.locator('[data-field-error="password"]').waitFor();
    expect(page.url()).toBe(BASE() + '/s/fernhill/join?_action=signUp'); // /sign-up leads to the studio's join page
    expect(await page.getByLabel('E-mail').inputValue()).toBe(email);
    expect(await page.getByLabel('Your name').inputValue()).toBe('Form Joiner');
    await page.getByLabel('Password').fill(PASSWORD);
    await page.getByRole('button', { name: 'Create account' }).click();
    // The same answer as for an address that has an account: no session, sign in next.
    expect(await page.getByRole('status').textContent()).toMatch(/^Thanks! Check your inbox/);
    await signInThroughForm(page, email, PASSWORD);
    expect(new URL(page.url()).pathname).toBe('/s/fernhill/library');
    await context.close();
  });

  it('signs in and goes to the page named by ?next=, also after a refused try', async () => {
    const { email } = await signUpMember('formnext');
    const context = await browser.newContext({ javaScriptEnabled: false });
    const page = await context.newPage();
    await page.goto(BASE() + '/sign-in?next=%2Faccount');
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password').fill('not the password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.locator('[data-field-error="password"]').waitFor();
    expect(page.url()).toBe(BASE() + '/sign-in?_action=signIn&next=%2Faccount');
    await page.getByLabel('Password').fill(PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(BASE() + '/account');
    await context.close();
  });

  it('asks for a reset link: a bad address at its field, then the one answer', async () => {
    const context = await browser.newContext({ javaScriptEnabled: false });
    const page = await context.newPage();
    await page.goto(BASE() + '/forgot-password');
    await page.getByLabel('E-mail').fill('not an address');
    await page.getByRole('button', { name: 'Send me a link' }).click();
    await page.locator('[data-field-error="email"]').waitFor();
    expect(page.url()).toBe(BASE() + '/forgot-password?_action=forgotPassword');
    await page.getByLabel('E-mail').fill(freshEmail('formreset'));
    await page.getByRole('button', { name: 'Send me a link' }).click();
    expect(await page.getByRole('status').textContent()).toMatch(/^If an account uses that address/);
    await context.close();
  });
});
