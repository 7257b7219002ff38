/**
 * The member's story: filter the library, open a class, acknowledge the caution, jump to a
 * chapter, read the interval clock, come back later and resume. Runs on the demo class
 * Desk-Break Mobility (invented demo data) with its recording made by the real pipeline.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { BASE, DEMO } from '../helpers/api-client';
import { launchBrowser, SHOTS } from '../helpers/browser';
import { ensureDeskBreakPublished } from '../helpers/demo-class';
import { formatClock } from '~/lib/time/format-time';
import { signInThroughForm } from '../helpers/role-pages';

let browser: Browser;

beforeAll(async () => {
  await ensureDeskBreakPublished();
  browser = await launchBrowser();
}, 360_000);
afterAll(() => browser?.close());

describe('a member in the library and the player', () => {
  it('filters, opens a class, jumps to the third chapter, reads the clock, and is offered to resume', async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await signInThroughForm(page, DEMO.member);
    await page.waitForURL(BASE() + '/s/fernhill/library');

    // Filters live in the URL and apply on the server.
    await page.getByLabel('Low impact').check();
    await page.getByLabel('Under 15 min').check();
    await page.getByRole('button', { name: 'Show classes' }).click();
    await page.waitForURL(/impact=low/);
    expect(page.url()).toContain('length=under-15');
    // Every card shown is low impact and under 15 minutes (other tests add classes of their own).
    const cards = await page.locator('[data-class-card]').evaluateAll((els) =>
      els.map((e) => ({ slug: e.getAttribute('data-class-card'), text: e.textContent ?? '' })),
    );
    expect(cards.map((c) => c.slug)).toContain('desk-break-mobility');
    expect(cards.map((c) => c.slug)).not.toContain('lunch-hour-ladder'); // 30 min
    expect(cards.map((c) => c.slug)).not.toContain('twenty-ten-finisher'); // high impact
    for (const c of cards) expect(c.text).toContain('low impact');
    await page.screenshot({ path: `${SHOTS}/library-filtered.png`, fullPage: true });

    await page.getByRole('link', { name: 'Desk-Break Mobility' }).click();
    await page.waitForURL(/\/classes\/desk-break-mobility/);
    // Astro drops the island's ssr attribute once React has hydrated it: only then do buttons work.
    await page.waitForSelector('astro-island:not([ssr])');
    await page.screenshot({ path: `${SHOTS}/player-caution.png`, fullPage: true });
    await page.getByRole('button', { name: /I understand/ }).click();
    await page.getByTestId('interval-clock').waitFor();
    const video = page.getByTestId('class-video');
    await video.evaluate((v: HTMLVideoElement) => {
      v.muted = true;
    });

    // Chromium's own WebVTT parser (the <track>) sees exactly the published chapters.
    const chapterButtons = page.locator('[data-chapter]');
    const published = await chapterButtons.count();
    await page.waitForFunction(() => {
      const t = (document.querySelector('video') as HTMLVideoElement).textTracks[0];
      return t && t.cues && t.cues.length > 0;
    });
    const trackCues = await video.evaluate((v: HTMLVideoElement) =>
      Array.from(v.textTracks[0]!.cues!).map((c) => [c.startTime, c.endTime, (c as VTTCue).text]),
    );
    expect(trackCues).toHaveLength(published);
    expect(trackCues[2]![2]).toBe('Shoulder circles · round 1 of 2');

    // Pause first (the caution's button started playback), so the jump lands on a still video:
    // a playing video moves on while the test reads it, by however long a busy machine takes
    // (it once read 55.316 for a jump to 55).
    await page.waitForFunction(() => !(document.querySelector('video') as HTMLVideoElement).paused);
    await video.evaluate((v: HTMLVideoElement) => v.pause());
    // Third chapter: Shoulder circles, round 1 of 2 (the demo plan's second station after the welcome).
    await page.locator('[data-chapter="3"]').click();
    await page.waitForFunction(() => {
      const v = document.querySelector('video') as HTMLVideoElement;
      return v.readyState >= 1 && !v.seeking;
    });
    const clock = page.getByTestId('interval-clock');
    await expect.poll(async () => clock.getByTestId('clock-now').textContent()).toBe('Shoulder circles');
    expect(await clock.getByTestId('clock-round').textContent()).toBe('Round 1 of 2');
    expect(await clock.getByTestId('clock-next').textContent()).toMatch(/^Next: Rest in 0:\d\d$/);
    expect(await page.locator('[data-chapter="3"]').getAttribute('aria-current')).toBe('step');
    expect(page.url()).toMatch(/#t=\d+(\.\d+)?$/);
    const chapterStart = trackCues[2]![0] as number;
    const at = await video.evaluate((v: HTMLVideoElement) => v.currentTime);
    // A paused seek lands where it was sent; 0.01 s covers the chapter time written with 3 decimals.
    expect(Math.abs(at - chapterStart)).toBeLessThan(0.01);
    await page.screenshot({ path: `${SHOTS}/player-chapter-3.png`, fullPage: true });

    // Watch on a few seconds past the jump, then pause: the pause reports the position.
    await video.evaluate((v: HTMLVideoElement) => void v.play());
    await page.waitForFunction((t) => (document.querySelector('video') as HTMLVideoElement).currentTime > t + 3, chapterStart);
    const reported: { position: number; status: number }[] = [];
    page.on('response', (r) => {
      if (r.url().endsWith('/progress') && r.request().method() === 'POST') reported.push({ position: r.request().postDataJSON().positionSeconds, status: r.status() });
    });
    await video.evaluate((v: HTMLVideoElement) => v.pause());
    const stoppedAt = await video.evaluate((v: HTMLVideoElement) => v.currentTime);
    // The pause's report carries the position where the video stopped; wait until it is stored.
    await expect.poll(() => reported.find((r) => r.position === stoppedAt)?.status).toBe(200);

    // Reload with the jump's #t= still in the URL: the saved position wins and is offered.
    await page.reload();
    await page.waitForSelector('astro-island:not([ssr])');
    expect(page.url()).toMatch(/#t=/);
    const offer = page.getByTestId('resume-offer');
    await offer.waitFor();
    expect(await offer.textContent()).toMatch(new RegExp(`You stopped at ${formatClock(stoppedAt)}\\.`)); // no space before the full stop
    expect(await video.evaluate((v: HTMLVideoElement) => v.currentTime)).toBeLessThan(chapterStart);
    await page.getByRole('button', { name: 'Resume' }).click();
    await page.waitForFunction((t) => Math.abs((document.querySelector('video') as HTMLVideoElement).currentTime - t) < 1.5, stoppedAt);
    await video.evaluate((v: HTMLVideoElement) => v.pause());

    // Come back later from the library (no fragment): the offer is there too.
    await page.goto(BASE() + '/library');
    await page.getByRole('link', { name: 'Desk-Break Mobility' }).first().click();
    await page.waitForURL(/\/classes\/desk-break-mobility$/);
    await offer.waitFor();
    await page.screenshot({ path: `${SHOTS}/player-resume.png`, fullPage: true });
    // Playing from the start instead (K on the focused player) answers the offer: it goes away.
    await video.focus();
    await page.keyboard.press('k');
    await offer.waitFor({ state: 'detached' });
    await video.evaluate((v: HTMLVideoElement) => v.pause());

    // A fresh link to a time (a shared chapter link, opened in a new tab) opens there, without the offer.
    const shared = await context.newPage();
    await shared.goto(BASE() + '/classes/desk-break-mobility#t=20');
    await shared.waitForSelector('astro-island:not([ssr])');
    await shared.waitForFunction(() => Math.abs((document.querySelector('video') as HTMLVideoElement).currentTime - 20) < 0.01);
    expect(await shared.getByTestId('resume-offer').count()).toBe(0);
    await context.close();
  });
});
