// A visitor finds a studio at its address, follows its join button, sees its price and trial,
// signs up there and, once signed in, is in that studio's library. Then the owner of another
// studio (started here) joins the same studio with one button and sees each studio's classes
// only under its own address. The people and the second studio are invented for the test.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { Browser } from 'playwright-core';
import { BASE } from '../helpers/api-client';
import { launchBrowser, SHOTS } from '../helpers/browser';
import { signInAfterStart } from '../helpers/role-pages';

const PASSWORD = 'a long enough password';
const AXE_SOURCE = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');
let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe('joining a studio at its address', () => {
  it('a visitor joins Fernhill from its page and lands in its library after signing in', async () => {
    const context = await browser.newContext({ javaScriptEnabled: false });
    const page = await context.newPage();
    const email = `joiner-${Date.now().toString(36)}@join.example`;
    try {
      await page.goto(BASE() + '/s/fernhill');
      expect(await page.getByRole('heading', { level: 1 }).textContent()).toContain('Fernhill Movement Co.');
      await page.getByRole('link', { name: 'Join Fernhill Movement Co.' }).click();
      await page.waitForURL(BASE() + '/s/fernhill/join');
      expect(await page.getByTestId('join-offer').textContent()).toMatch(/a month/);
      await page.screenshot({ path: `${SHOTS}/studio-join.png`, fullPage: true });
      await page.getByLabel('Your name').fill('Jo Iner');
      await page.getByLabel('E-mail').fill(email);
      await page.getByLabel('Password').fill(PASSWORD);
      await page.getByRole('button', { name: 'Create account' }).click();
      await page.getByRole('status').filter({ hasText: 'Check your inbox' }).waitFor();
      await page.locator('#main').getByRole('link', { name: 'Sign in' }).click();
      await page.getByLabel('E-mail').fill(email);
      await page.getByLabel('Password').fill(PASSWORD);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.waitForURL(BASE() + '/s/fernhill/library');
      expect(await page.getByRole('heading', { level: 1 }).textContent()).toBe('Library');
    } finally {
      await context.close();
    }
  });

  it('the owner of another studio joins with one button and sees each studio only under its address', async () => {
    const run = Date.now().toString(36);
    const slug = `other-${run}`;
    const context = await browser.newContext();
    const page = await context.newPage();
    try {
      // A visitor starts a studio of their own: its owner, and in no other studio yet.
      await page.goto(BASE() + '/start');
      await page.getByLabel('Your name').fill('Other Owner');
      await page.getByLabel('E-mail').fill(`other-owner-${run}@join.example`);
      await page.getByLabel('Password').fill(PASSWORD);
      await page.getByLabel('Studio name').fill('Other Studio');
      await page.getByLabel('Address').fill(slug);
      await page.getByRole('button', { name: 'Start my studio' }).click();
      await signInAfterStart(page, `other-owner-${run}@join.example`, PASSWORD);

      await page.goto(BASE() + '/s/fernhill');
      await page.getByRole('link', { name: 'Join Fernhill Movement Co.' }).click();
      await page.getByRole('heading', { name: 'Join as Other Owner' }).waitFor();
      await page.getByRole('button', { name: 'Join Fernhill Movement Co.' }).click();
      await page.waitForURL(BASE() + '/s/fernhill/library');
      expect(await page.getByRole('heading', { level: 1 }).textContent()).toBe('Library');
      await page.goto(BASE() + '/s/fernhill');
      expect(await page.locator('[data-join-link]').count()).toBe(0); // a member now: no join offer

      // Their own studio's library shows none of Fernhill's classes, and its page offers no join to its owner.
      await page.goto(`${BASE()}/s/${slug}/library`);
      expect(await page.getByTestId('result-count').textContent()).toContain('No classes match');
      expect(await page.content()).not.toContain('Desk-Break Mobility');
      await page.goto(`${BASE()}/s/${slug}`);
      expect(await page.locator('[data-join-link]').count()).toBe(0);

      // On a phone (390 px) the switcher sits in the menu: back to their own studio's staff pages.
      await page.setViewportSize({ width: 390, height: 844 });
      await page.goto(BASE() + '/s/fernhill/library');
      expect(await page.locator('form[data-studio-switcher="header"]').isVisible()).toBe(false);
      await page.getByText('Menu').click();
      const switcher = page.locator('form[data-studio-switcher="menu"]');
      await switcher.getByLabel('Studio').selectOption({ label: 'Other Studio' });
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
      // axe-core (npm) with WCAG 2.0–2.2 A/AA tags on the open menu: no serious or critical finding.
      await page.evaluate(AXE_SOURCE);
      const axe = (await page.evaluate(() => (window as unknown as { axe: { run: (c: unknown, o: unknown) => Promise<unknown> } }).axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'] } }))) as { violations: { id: string; impact: string | null }[] };
      expect(axe.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => v.id)).toEqual([]);
      await page.screenshot({ path: `${SHOTS}/studio-switcher-phone.png` });
      await switcher.getByRole('button', { name: 'Switch' }).click();
      await page.waitForURL(BASE() + '/studio');
      expect(await page.locator('header').textContent()).toContain('Other Studio');
    } finally {
      await context.close();
    }
  });
});
