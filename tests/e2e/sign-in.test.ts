import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { BASE, DEMO } from '../helpers/api-client';
import { launchBrowser, SHOTS } from '../helpers/browser';
import { signedInPage } from '../helpers/role-pages';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(() => browser?.close());

describe('signing in through the form', () => {
  it.each([
    ['owner', DEMO.owner, '/studio', 'Fernhill Movement Co.'],
    ['coach', DEMO.coach, '/studio/classes', 'Classes'],
    ['editor', DEMO.editor, '/studio/classes', 'Classes'],
    ['member', DEMO.member, '/s/fernhill/library', 'Library'],
  ])('the %s lands on their home page', async (role, email, home, heading) => {
    const { context, page } = await signedInPage(browser, email);
    await page.waitForURL(BASE() + home);
    expect(await page.getByRole('heading', { level: 1 }).textContent()).toContain(heading);
    await page.screenshot({ path: `${SHOTS}/home-${role}.png`, fullPage: true });
    await context.close();
  });

  it('shows a wrong password next to the password field and keeps the e-mail', async () => {
    const page = await browser.newPage();
    await page.goto(BASE() + '/sign-in');
    await page.getByLabel('E-mail').fill(DEMO.coach);
    await page.getByLabel('Password').fill('not the password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    const error = page.locator('[data-field-error="password"]');
    await error.waitFor();
    expect(await error.textContent()).toBe('That e-mail and password do not match an account.');
    // The message is tied to the field for assistive tech.
    expect(await page.getByLabel('Password').getAttribute('aria-describedby')).toBe('password-error');
    expect(await page.getByLabel('E-mail').inputValue()).toBe(DEMO.coach);
    // A refused post stays on the sign-in page (Astro's form-action URL names the action).
    expect(page.url()).toBe(BASE() + '/sign-in?_action=signIn');
    await page.screenshot({ path: `${SHOTS}/sign-in-error.png`, fullPage: true });
    await page.close();
  });
});
