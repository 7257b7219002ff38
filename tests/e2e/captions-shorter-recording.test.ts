/**
 * Captions against a newer, shorter recording, in Chromium through the real controls: a class's
 * captions were timed against a 20 s take, then a 13 s take replaces it (both generated test
 * clips, invented captions). The publishing panel says the captions end after the recording and
 * Publish is off; the captions editor marks them and its "Trim to the recording" fix makes them
 * fit, after which the panel no longer blocks.
 */
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { type ApiClient, BASE, DEMO, signedIn } from '../helpers/api-client';
import { launchBrowser, SHOTS } from '../helpers/browser';
import { SMALL_PLAN, smallTimeline, uploadReadyRecording } from '../helpers/published-class';
import { signedInPage } from '../helpers/role-pages';

let browser: Browser;
let dir: string;
let coach: ApiClient;
let lessonId: string;
let recordingSeconds: number;

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'roundmark-captions-trim-'));
  coach = await signedIn(DEMO.coach);
  const lesson = await (await coach.post('/api/lessons', { title: `Captions trim ${Date.now()}`, advertisedMinutes: 1, impact: 'low' })).json();
  lessonId = lesson.id;
  await coach.put(`/api/lessons/${lessonId}/plan`, { version: lesson.version, ...SMALL_PLAN });
  await coach.put(`/api/lessons/${lessonId}/timeline`, { version: 0, ...smallTimeline() });
  await uploadReadyRecording(coach, dir, lessonId, 20);
  const cues = [
    { startSeconds: 1, endSeconds: 3, text: 'Step up.' },
    { startSeconds: 11, endSeconds: 14.5, text: 'Runs past the new end.' },
    { startSeconds: 16, endSeconds: 19, text: 'After the new end.' },
  ];
  const put = await coach.put(`/api/lessons/${lessonId}/captions`, { version: 0, language: 'en', label: 'English captions', cues });
  if (put.status !== 200) throw new Error(`captions: ${put.status}`);
  await uploadReadyRecording(coach, dir, lessonId, 13);
  recordingSeconds = ((await (await coach.get(`/api/lessons/${lessonId}/captions`)).json()) as { recordingSeconds: number }).recordingSeconds;
  browser = await launchBrowser();
}, 300_000);
afterAll(async () => {
  await browser?.close();
  await rm(dir, { recursive: true, force: true });
});

describe('captions past a shorter recording', () => {
  it('block the publish in the panel until the editor trims them to the recording', async () => {
    const { context, page } = await signedInPage(browser, DEMO.coach, { viewport: { width: 1366, height: 900 } });
    await page.goto(`${BASE()}/studio/classes/${lessonId}`);
    const panel = page.getByTestId('publish-panel');
    await panel.getByText('2 captions end after the recording').waitFor();
    expect(await panel.getByRole('button', { name: 'Publish now' }).isDisabled()).toBe(true);

    const section = page.locator('[data-captions-section]');
    const pastEnd = section.locator('[data-captions-past-end]');
    await pastEnd.waitFor();
    expect(await pastEnd.textContent()).toContain('2 captions end after the recording');
    // Each caption past the end says so at its own row.
    expect(await section.getByLabel('Caption 2 end').getAttribute('aria-invalid')).toBe('true');
    expect(await section.getByLabel('Caption 3 end').getAttribute('aria-invalid')).toBe('true');
    expect(await section.getByLabel('Caption 1 end').getAttribute('aria-invalid')).toBe('false');
    await page.screenshot({ path: `${SHOTS}/captions-past-end.png`, fullPage: true });

    await pastEnd.getByRole('button', { name: 'Trim to the recording' }).click();
    await section.getByRole('status').filter({ hasText: 'Captions trimmed to the recording: 1 removed, 1 shortened.' }).waitFor();
    expect(await pastEnd.count()).toBe(0);
    const stored = (await (await coach.get(`/api/lessons/${lessonId}/captions`)).json()) as { cues: { endSeconds: number; text: string }[] };
    expect(stored.cues.map((c) => [c.text, c.endSeconds])).toEqual([
      ['Step up.', 3],
      ['Runs past the new end.', Math.round(recordingSeconds * 1000) / 1000], // saved to the millisecond
    ]);

    await page.reload();
    await panel.waitFor();
    expect(await panel.textContent()).not.toContain('end after the recording');
    await panel.getByLabel('I reviewed these warnings; publish anyway.').check();
    await panel.getByRole('button', { name: 'Publish now' }).click();
    await panel.getByRole('status').filter({ hasText: 'Published as version 1.' }).waitFor();
    await context.close();
  }, 120_000);
});
