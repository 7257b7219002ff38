/**
 * Phones: at 390 × 844 CSS px (a common current phone size; common practice, no source) no page
 * of any role is wider than the screen, the staff navigation folds into a menu from which
 * "Sign out" works, and the interval clock takes its compact form.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { BASE } from '../helpers/api-client';
import { launchBrowser, SHOTS } from '../helpers/browser';
import { ensureDeskBreakPublished } from '../helpers/demo-class';
import { pagesByRole, PUBLIC_PAGES, signedInContext, type DemoRole } from '../helpers/role-pages';

const PHONE = { width: 390, height: 844 };
let browser: Browser;
let pages: Record<DemoRole, string[]>;

beforeAll(async () => {
  await ensureDeskBreakPublished();
  pages = await pagesByRole();
  browser = await launchBrowser();
}, 360_000);
afterAll(() => browser?.close());

/** What sticks out past the right edge, to name the culprit when the check fails. */
const overflow = (page: Page) =>
  page.evaluate(() => {
    const width = document.documentElement.clientWidth;
    // Content inside a box that scrolls or clips on its own (a wide table) does not widen the page,
    // unless it is positioned against something outside that box (an sr-only span in a table cell
    // whose scroll box is not positioned escapes it).
    const inOwnBox = (e: Element) => {
      const absolute = getComputedStyle(e).position === 'absolute';
      for (let p = absolute ? (e as HTMLElement).offsetParent : e.parentElement; p && p !== document.body; p = p.parentElement) {
        if (getComputedStyle(p).overflowX !== 'visible') return true;
      }
      return false;
    };
    const wide = [...document.querySelectorAll('body *')]
      .filter((e) => e.getBoundingClientRect().right > width + 0.5 && !inOwnBox(e))
      .slice(0, 5)
      .map((e) => `${e.tagName.toLowerCase()}.${String(e.className).slice(0, 60)}`);
    return { scrollWidth: document.documentElement.scrollWidth, width, wide };
  });

describe('at 390 px wide', () => {
  it.each(['owner', 'coach', 'editor', 'member'] as const)('no page of the %s is wider than the screen', async (role) => {
    const { context, page } = await signedInContext(browser, role, PHONE);
    for (const path of pages[role]) {
      await page.goto(BASE() + path);
      await page.waitForLoadState('load');
      const o = await overflow(page);
      expect({ path, ...o }).toEqual({ path, scrollWidth: PHONE.width, width: PHONE.width, wide: [] });
    }
    await context.close();
  });

  it('no public page is wider than the screen', async () => {
    const context = await browser.newContext({ viewport: PHONE });
    const page = await context.newPage();
    for (const path of PUBLIC_PAGES) {
      await page.goto(BASE() + path);
      const o = await overflow(page);
      expect({ path, ...o }).toEqual({ path, scrollWidth: PHONE.width, width: PHONE.width, wide: [] });
    }
    await context.close();
  });

  it('the owner opens the menu and signs out from it', async () => {
    const { context, page } = await signedInContext(browser, 'owner', PHONE);
    await page.goto(BASE() + '/studio/classes');
    const signOut = page.getByRole('button', { name: 'Sign out' });
    expect(await signOut.isVisible()).toBe(false); // folded away
    await page.locator('[data-nav-menu] > summary').click();
    await page.getByRole('link', { name: 'Members' }).click();
    await page.waitForURL(/\/studio\/members$/);
    await page.locator('[data-nav-menu] > summary').click();
    await page.screenshot({ path: `${SHOTS}/phone-menu-open.png` });
    await signOut.click();
    await page.waitForURL((u) => u.pathname === '/' || u.pathname === '/sign-in');
    await context.close();
  });

  it('the interval clock is compact and sits under the video, with digits still large', async () => {
    const { context, page } = await signedInContext(browser, 'member', PHONE);
    await page.goto(BASE() + '/classes/desk-break-mobility');
    await page.waitForSelector('astro-island:not([ssr])');
    const understand = page.getByRole('button', { name: /I understand/ });
    if (await understand.count()) await understand.click();
    const clock = page.getByTestId('interval-clock');
    await clock.waitFor();
    const [videoBox, clockBox] = [await page.getByTestId('class-video').boundingBox(), await clock.boundingBox()];
    // Under the video, not on top of it.
    expect(clockBox!.y).toBeGreaterThanOrEqual(videoBox!.y + videoBox!.height - 1);
    // Readable at 3 m: a 20/20 (decimal 1.0) Snellen letter subtends 5 arcminutes, 4.4 mm at 3 m
    // (visual-acuity definition, from memory); for comfortable reading we ask for 3× that, 13 mm
    // (rule of thumb, common practice, no source). A 390 px wide phone screen is about 64 mm wide
    // (from memory), so 6.1 CSS px per mm: 13 mm ≈ 80 CSS px of digit height, measured on the glyph.
    const digitHeight = await clock.getByTestId('clock-remaining').evaluate((e) => {
      const cs = getComputedStyle(e);
      const ctx = document.createElement('canvas').getContext('2d')!;
      ctx.font = `${cs.fontWeight} ${cs.fontSize} ${cs.fontFamily}`;
      const m = ctx.measureText('0');
      return m.actualBoundingBoxAscent + m.actualBoundingBoxDescent;
    });
    expect(digitHeight).toBeGreaterThanOrEqual(80);
    expect(await clock.getByTestId('clock-remaining').textContent()).toMatch(/^\d+:\d\d$/);
    await page.screenshot({ path: `${SHOTS}/phone-player.png`, fullPage: true });
    await context.close();
  });
});
