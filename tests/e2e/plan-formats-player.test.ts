// A member plays a published class whose plan has a station done per side, an AMRAP and an
// EMOM, through the real player in Chromium: the chapters (the page's list and Chromium's own
// WebVTT reader) and the interval clock say the side and the format's words, and the AMRAP's
// chapter and clock list the exercises members repeat. The class, its
// plan, marks and generated recording are invented for the test; only the publish and the set-up
// go through the API, the member uses the page.
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { type ApiClient, BASE, DEMO, signedIn } from '../helpers/api-client';
import { launchBrowser, SHOTS } from '../helpers/browser';
import { makeClip } from '../helpers/media-files';
import { signInThroughForm } from '../helpers/role-pages';
import { uploadWhole, waitForRecording } from '../helpers/upload-flow';

let browser: Browser;
let coach: ApiClient;
let dir = '';
let slug = '';

// Worked by hand: Player side step per side, 4 s each with a 1 s switch (left 0–4, switch 4–5,
// right 5–9); AMRAP 8 s (9–17); EMOM 1 minute with 10 s of work (17–27, rest 27–77). 77 s.
const PLAN = {
  blocks: [
    { kind: 'circuit', rounds: 1, stations: [{ exercise: 'Player side step', workSeconds: 4, restSeconds: 0, perSide: true, switchSeconds: 1 }] },
    { kind: 'amrap', seconds: 8, exercises: ['Player burpee', 'Player squat'] },
    { kind: 'emom', minutes: 1, workSeconds: 10, exercises: ['Player swing'] },
  ],
};
const TIMELINE = {
  segments: [
    { id: 'l', kind: 'work', startSeconds: 0, endSeconds: 4, exercise: 'Player side step', round: 1, side: 'left' },
    { id: 'sw', kind: 'rest', startSeconds: 4, endSeconds: 5, round: 1, side: 'left' },
    { id: 'r', kind: 'work', startSeconds: 5, endSeconds: 9, exercise: 'Player side step', round: 1, side: 'right' },
    { id: 'a', kind: 'work', startSeconds: 9, endSeconds: 17, format: 'amrap' },
    { id: 'e', kind: 'work', startSeconds: 17, endSeconds: 27, exercise: 'Player swing', round: 1, format: 'emom' },
    { id: 'er', kind: 'rest', startSeconds: 27, endSeconds: 77, round: 1, format: 'emom' },
  ],
  cues: [],
};

beforeAll(async () => {
  coach = await signedIn(DEMO.coach);
  browser = await launchBrowser();
  dir = await mkdtemp(path.join(tmpdir(), 'formats-player-'));
  const lesson = await (await coach.post('/api/lessons', { title: 'Sides AMRAP EMOM player check', advertisedMinutes: 1, impact: 'low' })).json();
  slug = lesson.slug;
  expect((await coach.put(`/api/lessons/${lesson.id}/plan`, { version: lesson.version, ...PLAN })).status).toBe(200);
  expect((await coach.put(`/api/lessons/${lesson.id}/timeline`, { version: 0, ...TIMELINE })).status).toBe(200);
  const clip = path.join(dir, 'class.mp4');
  await makeClip(clip, { seconds: 77, size: '320x180' });
  const { recordingId } = await uploadWhole(coach, lesson.id, 'class.mp4', new Uint8Array(await readFile(clip)));
  const ready = await waitForRecording(coach, recordingId);
  expect(ready.state).toBe('ready');
  // The only warning is the advertised length (77 s against 1 minute ± 10 %).
  const pub = await coach.post(`/api/lessons/${lesson.id}/publish`, { acknowledgeWarnings: true });
  expect(pub.status).toBe(201);
}, 300_000);

afterAll(async () => {
  await browser?.close();
  if (dir) await rm(dir, { recursive: true, force: true });
});

describe('the player for a class with sides, an AMRAP and an EMOM', () => {
  it('chapters and the interval clock say the side and the format', async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await signInThroughForm(page, DEMO.member);
    await page.goto(`${BASE()}/classes/${slug}`);
    await page.waitForSelector('astro-island:not([ssr])');
    const understand = page.getByRole('button', { name: /I understand/ });
    if (await understand.count()) await understand.click();
    const video = page.getByTestId('class-video');
    await video.evaluate((v: HTMLVideoElement) => { v.muted = true; v.pause(); });

    await page.waitForFunction(() => {
      const t = (document.querySelector('video') as HTMLVideoElement).textTracks[0];
      return t && t.cues && t.cues.length > 0;
    });
    const cueTexts = await video.evaluate((v: HTMLVideoElement) => Array.from(v.textTracks[0]!.cues!).map((c) => (c as VTTCue).text));
    expect(cueTexts).toEqual([
      'Player side step — left',
      'Player side step — right',
      'AMRAP 0:08 — round as many as you can',
      'EMOM minute 1 of 1 — Player swing',
    ]);

    const clock = page.getByTestId('interval-clock');
    const jump = async (n: number) => {
      await video.evaluate((v: HTMLVideoElement) => v.pause());
      await page.locator(`[data-chapter="${n}"]`).click();
      await page.waitForFunction(() => {
        const v = document.querySelector('video') as HTMLVideoElement;
        return v.readyState >= 1 && !v.seeking;
      });
      await video.evaluate((v: HTMLVideoElement) => v.pause());
    };
    await jump(2);
    await expect.poll(() => clock.getByTestId('clock-now').textContent()).toBe('Player side step — right');
    await jump(3);
    await expect.poll(() => clock.getByTestId('clock-now').textContent()).toBe('Round as many as you can');
    expect(await clock.getByTestId('clock-kind').textContent()).toBe('AMRAP 0:08');
    // What to repeat, from the plan's AMRAP block: on the clock and in the chapter list.
    expect(await clock.getByTestId('clock-repeat').textContent()).toBe('Repeat: Player burpee · Player squat');
    expect(await page.locator('[data-chapter="3"] [data-chapter-repeat]').textContent()).toBe('Repeat: Player burpee · Player squat');
    expect(await page.locator('[data-chapter-repeat]').count()).toBe(1);
    await jump(4);
    await expect.poll(() => clock.getByTestId('clock-now').textContent()).toBe('Player swing');
    expect(await clock.getByTestId('clock-kind').textContent()).toBe('EMOM minute 1 of 1');
    await page.screenshot({ path: `${SHOTS}/formats-player-emom.png`, fullPage: true });
    await context.close();
  }, 120_000);
});
