/**
 * Captions in the member's player, on the demo class Desk-Break Mobility (invented demo data,
 * with its demo captions): the published WebVTT file, Chromium's own reading of the captions
 * track, and the CC button and key, remembered with the member's account across a reload.
 */
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { WebVTTParser } from 'webvtt-parser';
import { BASE, DEMO, signedIn } from '../helpers/api-client';
import { launchBrowser, SHOTS } from '../helpers/browser';
import { holdCaptionsChoice } from '../helpers/captions-choice';
import { ensureDeskBreakPublished } from '../helpers/demo-class';
import { signedInPage } from '../helpers/role-pages';

let browser: Browser;
let choice: Awaited<ReturnType<typeof holdCaptionsChoice>>;

beforeAll(async () => {
  await ensureDeskBreakPublished();
  choice = await holdCaptionsChoice(DEMO.member);
  browser = await launchBrowser();
}, 360_000);
// Each test starts with the member's captions off, whatever another test file left behind…
beforeEach(() => choice.set(false));
afterAll(async () => {
  // …and the member gets back the choice they had before this file ran.
  await choice?.restore();
  await browser?.close();
});

/** Opens the class with the player hydrated and past the first-play caution. */
async function openClass(page: Page): Promise<void> {
  await page.goto(BASE() + '/classes/desk-break-mobility');
  // Astro drops the island's ssr attribute once React has hydrated it: only then do buttons work.
  await page.waitForSelector('astro-island:not([ssr])');
  const understand = page.getByRole('button', { name: /I understand/ });
  if (await understand.count()) await understand.click();
  await page.getByTestId('interval-clock').waitFor();
  await page.getByTestId('class-video').evaluate((v: HTMLVideoElement) => {
    v.muted = true;
    v.pause();
  });
}

/** The captions track as Chromium sees it, once its cues are loaded. */
async function captionsTrack(page: Page) {
  await page.waitForFunction(() => {
    const t = Array.from((document.querySelector('video') as HTMLVideoElement).textTracks).find((x) => x.kind === 'captions');
    return !!t?.cues && t.cues.length > 0;
  });
  return page.getByTestId('class-video').evaluate((v: HTMLVideoElement) => {
    const t = Array.from(v.textTracks).find((x) => x.kind === 'captions')!;
    return { mode: t.mode, label: t.label, language: t.language, cues: Array.from(t.cues!).map((c) => [c.startTime, c.endTime, (c as VTTCue).text]) };
  });
}

const remembered = (page: Page) => page.waitForResponse((r) => r.url().endsWith('/api/me/player-preferences') && r.request().method() === 'PUT' && r.status() === 200);

describe('captions in the player', () => {
  it('offer the published captions as a captions track that Chromium reads exactly', async () => {
    const member = await signedIn(DEMO.member);
    const vtt = await (await member.get('/s/fernhill/classes/desk-break-mobility/captions.vtt')).text();
    // webvtt-parser 2.2.0 follows the W3C WebVTT parsing algorithm (https://www.w3.org/TR/webvtt1/).
    const published = new WebVTTParser().parse(vtt);
    expect(published.errors).toEqual([]);
    expect(published.cues.length).toBeGreaterThan(20);

    const { context, page } = await signedInPage(browser, DEMO.member, { viewport: { width: 1280, height: 900 } });
    await openClass(page);
    // Chromium's own WebVTT parser, through <track kind="captions">, is a second, independent reader.
    const track = await captionsTrack(page);
    expect(track).toMatchObject({ label: 'English captions', language: 'en', mode: 'hidden' });
    expect(track.cues).toHaveLength(published.cues.length);
    expect(track.cues).toEqual(published.cues.map((c) => [c.startTime, c.endTime, c.text]));
    await context.close();
  });

  it('turn on with the CC button and off with T, each remembered after a reload; C stays the clock', async () => {
    const { context, page } = await signedInPage(browser, DEMO.member, { viewport: { width: 1280, height: 900 } });
    await openClass(page);
    const cc = page.getByRole('button', { name: 'Captions', exact: true });
    expect(await cc.getAttribute('aria-pressed')).toBe('false');
    await expect.poll(() => page.getByTestId('player-keys').textContent()).toContain('T captions');

    const saved = remembered(page);
    await cc.click();
    await saved;
    expect(await cc.getAttribute('aria-pressed')).toBe('true');
    expect((await captionsTrack(page)).mode).toBe('showing');
    await page.screenshot({ path: `${SHOTS}/player-captions-on.png` });

    await page.reload();
    await openClass(page);
    expect(await cc.getAttribute('aria-pressed')).toBe('true');
    expect((await captionsTrack(page)).mode).toBe('showing');

    // C is the clock's key: it hides the clock and leaves the captions alone.
    await cc.focus();
    await page.keyboard.press('c');
    await page.getByTestId('interval-clock').waitFor({ state: 'detached' });
    expect(await cc.getAttribute('aria-pressed')).toBe('true');

    const savedOff = remembered(page);
    await page.keyboard.press('t');
    await savedOff;
    expect(await cc.getAttribute('aria-pressed')).toBe('false');
    expect((await captionsTrack(page)).mode).toBe('hidden');

    await page.reload();
    await openClass(page);
    expect(await cc.getAttribute('aria-pressed')).toBe('false');
    expect((await captionsTrack(page)).mode).toBe('hidden');
    await context.close();
  });
});
