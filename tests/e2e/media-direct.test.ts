/**
 * Video bytes never pass through the app: a member plays a class, and every HLS segment comes
 * straight from the object store through the signed links in the playlist the app rewrote.
 * The class and its 12 s recording are generated for the test (invented, see published-class.ts).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser } from 'playwright-core';
import { BASE, DEMO, signedIn } from '../helpers/api-client';
import { launchBrowser } from '../helpers/browser';
import { createSmallClass } from '../helpers/published-class';
import { STORE_ORIGIN } from '../helpers/media-fetch';
import { startPlayingMuted } from '../helpers/player';
import { signInThroughForm } from '../helpers/role-pages';

let browser: Browser;
let dir: string;
let cls: { slug: string; recordingId: string };

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'roundmark-direct-'));
  const coach = await signedIn(DEMO.coach);
  cls = await createSmallClass(coach, dir, `Straight from storage ${Date.now()}`);
  const lesson = (await (await coach.get('/api/lessons')).json()).lessons.find((l: { slug: string }) => l.slug === cls.slug);
  const pub = await coach.post(`/api/lessons/${lesson.id}/publish`, { acknowledgeWarnings: true });
  if (pub.status !== 201) throw new Error(`publish: ${pub.status} ${await pub.text()}`);
  browser = await launchBrowser();
}, 300_000);
afterAll(async () => {
  await browser?.close();
  await rm(dir, { recursive: true, force: true });
});

describe('media delivery', () => {
  it('plays a class with no segment request reaching the app', async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    const appSegments: string[] = [];
    const storeSegments: string[] = [];
    page.on('request', (req) => {
      const url = new URL(req.url());
      if (!url.pathname.endsWith('.ts')) return;
      if (url.origin === new URL(BASE()).origin) appSegments.push(url.pathname);
      if (url.origin === STORE_ORIGIN) storeSegments.push(url.pathname);
    });
    await signInThroughForm(page, DEMO.member);
    await page.waitForURL(BASE() + '/s/fernhill/library');
    await page.goto(`${BASE()}/classes/${cls.slug}`);
    await page.waitForSelector('astro-island:not([ssr])');
    await startPlayingMuted(page);
    // Played on to the end: every segment of the 12 s class was needed.
    await page.waitForFunction(() => (document.querySelector('video') as HTMLVideoElement).currentTime > 10, undefined, { timeout: 120_000 });
    expect(storeSegments.length).toBeGreaterThanOrEqual(3); // 12 s in 4 s segments
    expect(appSegments).toEqual([]);
    await context.close();
  });
});
