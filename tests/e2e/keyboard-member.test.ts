/**
 * A member without a mouse: signs in, filters the library, opens a class, plays it and jumps
 * between chapters and turns captions on with the keyboard only. Every stop the Tab key makes shows a visible focus
 * indicator (WCAG 2.2 SC 2.4.7 Focus Visible).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Locator, Page } from 'playwright-core';
import { BASE, DEMO, DEMO_PASSWORD } from '../helpers/api-client';
import { launchBrowser, SHOTS } from '../helpers/browser';
import { holdCaptionsChoice } from '../helpers/captions-choice';
import { ensureDeskBreakPublished } from '../helpers/demo-class';

let browser: Browser;
let choice: Awaited<ReturnType<typeof holdCaptionsChoice>>;
beforeAll(async () => {
  await ensureDeskBreakPublished();
  // The member starts with captions off here, whatever another test left, and gets their choice back after.
  choice = await holdCaptionsChoice(DEMO.member);
  await choice.set(false);
  browser = await launchBrowser();
}, 360_000);
afterAll(async () => {
  await choice?.restore();
  await browser?.close();
});

/** The captions track's mode as Chromium has it ('showing' when members see the captions). */
const captionsMode = (page: Page) =>
  page.getByTestId('class-video').evaluate((v: HTMLVideoElement) => Array.from(v.textTracks).find((t) => t.kind === 'captions')?.mode ?? 'none');
/** Waits for the player to remember a captions choice with the account. */
const remembered = (page: Page) => page.waitForResponse((r) => r.url().endsWith('/api/me/player-preferences') && r.request().method() === 'PUT' && r.status() === 200);

/** What has focus, and whether it shows it (an outline or a ring). */
const focused = (page: Page) =>
  page.evaluate(() => {
    const e = document.activeElement as HTMLElement | null;
    if (!e || e === document.body) return { what: 'body', visible: false };
    const shows = (el: Element) => {
      const cs = getComputedStyle(el);
      return (cs.outlineStyle !== 'none' && parseFloat(cs.outlineWidth) >= 1) || cs.boxShadow !== 'none';
    };
    // A video's focus can sit on its own control bar inside the browser's shadow DOM, which a page
    // cannot style or read: there the frame around the video (its parent) must show a ring.
    const frame = e.tagName === 'VIDEO' ? e.parentElement : null;
    return { what: `${e.tagName.toLowerCase()} “${(e.getAttribute('aria-label') ?? e.textContent ?? '').trim().slice(0, 40)}”`, visible: shows(e) || (!!frame && shows(frame)) };
  });

/** Presses Tab until the target has focus, checking the focus is visible at every stop. */
async function tabTo(page: Page, target: Locator, stops: string[], max = 80) {
  for (let i = 0; i < max; i++) {
    await page.keyboard.press('Tab');
    const f = await focused(page);
    stops.push(f.what);
    // "body": focus went past the last control to the browser's own UI; the next Tab comes back.
    if (f.what !== 'body') expect(f.visible, `focus not visible on ${f.what}; stops: ${stops.slice(-6).join(' → ')}`).toBe(true);
    if (await target.evaluate((el) => el === document.activeElement)) return;
  }
  throw new Error(`Tab never reached the target; stops: ${stops.slice(-10).join(' → ')}`);
}

describe('keyboard only', () => {
  it('signs in, filters, opens a class, plays and jumps chapters without a mouse', async () => {
    const context = await browser.newContext({ viewport: { width: 1366, height: 900 } });
    const page = await context.newPage();
    const stops: string[] = [];
    await page.goto(BASE() + '/sign-in');
    await tabTo(page, page.getByLabel('E-mail'), stops);
    await page.keyboard.type(DEMO.member);
    await tabTo(page, page.getByLabel('Password'), stops);
    await page.keyboard.type(DEMO_PASSWORD);
    await page.keyboard.press('Enter');
    await page.waitForURL(BASE() + '/s/fernhill/library');

    await tabTo(page, page.getByLabel('Low impact'), stops);
    await page.keyboard.press('Space');
    await tabTo(page, page.getByLabel('Under 15 min'), stops);
    await page.keyboard.press('Space');
    await tabTo(page, page.getByRole('button', { name: 'Show classes' }), stops);
    await page.keyboard.press('Enter');
    await page.waitForURL(/impact=low/);
    expect(await page.getByLabel('Low impact').isChecked()).toBe(true);

    await tabTo(page, page.locator('[data-class-card="desk-break-mobility"] a').first(), stops);
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/classes\/desk-break-mobility/);
    await page.waitForFunction(() => !document.querySelector('astro-island[ssr]'));

    const understand = page.getByRole('button', { name: /I understand/ });
    if (await understand.count()) {
      // The caution takes focus itself, so Enter answers it.
      expect(await understand.evaluate((el) => el === document.activeElement)).toBe(true);
      await page.keyboard.press('Enter');
    }
    await page.getByTestId('interval-clock').waitFor();
    const video = page.getByTestId('class-video');
    await video.evaluate((v: HTMLVideoElement) => {
      v.muted = true;
      v.pause();
    });

    // Into the chapter list, then the player's keys: K plays, N and P jump chapters.
    await tabTo(page, page.locator('[data-chapter="1"]'), stops);
    await page.keyboard.press('k');
    await page.waitForFunction(() => !(document.querySelector('video') as HTMLVideoElement).paused);
    await page.keyboard.press('k');
    await page.waitForFunction(() => (document.querySelector('video') as HTMLVideoElement).paused);
    const current = () => page.locator('[data-chapter][aria-current="step"]').getAttribute('data-chapter');
    const before = Number(await current());
    await page.keyboard.press('n');
    await expect.poll(async () => Number(await current())).toBe(before + 1);
    await page.keyboard.press('n');
    await expect.poll(async () => Number(await current())).toBe(before + 2);
    await page.keyboard.press('p');
    await expect.poll(async () => Number(await current())).toBe(before + 1);

    // Captions: T (C is the clock's key) turns them on and off again…
    const cc = page.getByTestId('captions-toggle');
    expect(await cc.getAttribute('aria-pressed')).toBe('false');
    expect(await captionsMode(page)).toBe('hidden');
    let saved = remembered(page);
    await page.keyboard.press('t');
    await saved;
    expect(await cc.getAttribute('aria-pressed')).toBe('true');
    expect(await captionsMode(page)).toBe('showing');
    saved = remembered(page);
    await page.keyboard.press('t');
    await saved;
    expect(await cc.getAttribute('aria-pressed')).toBe('false');
    expect(await captionsMode(page)).toBe('hidden');
    // …and the CC button is reached with Tab (focus visible on the way) and pressed with Enter.
    await tabTo(page, cc, stops);
    saved = remembered(page);
    await page.keyboard.press('Enter');
    await saved;
    expect(await cc.getAttribute('aria-pressed')).toBe('true');
    expect(await captionsMode(page)).toBe('showing');
    expect((await focused(page)).visible).toBe(true);
    await page.screenshot({ path: `${SHOTS}/keyboard-player.png` });
    console.log(`keyboard stops (${stops.length}): ${stops.join(' → ')}`);
    await context.close();
  });
});
