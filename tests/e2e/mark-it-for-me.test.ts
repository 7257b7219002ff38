// The coach's "Mark it for me" story through the real app, worker and Chromium: a generated
// recording (invented for the test: a short intervals class with timer beeps, music and
// chatter, see lib/media/class-soundtrack.ts) is uploaded with the class page's widget, the
// coach presses "Mark it for me", reviews the uncertain boundaries with U, accepts, saves, the
// check is clean, and the coach publishes. The coach forgot the timer at one change, so that
// boundary has no sound and must come out uncertain. The API is read only to wait for the
// worker and to check what was stored.
// Screenshots go to test-results/screenshots/mark-it-*.png.
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { scoreSoundtrack, type SoundtrackScore } from '~/lib/media/class-soundtrack';
import { expandPlan } from '~/lib/plan/expand-plan';
import { planSchema } from '~/lib/plan/plan-schema';
import { renderSoundtrack } from '~/server/media/render-soundtrack';
import { ApiClient, BASE, DEMO } from '../helpers/api-client';
import { launchBrowser, SHOTS } from '../helpers/browser';
import { matchedShare } from '../helpers/marking-fixtures';
import { signInThroughForm } from '../helpers/role-pages';

const planInput = {
  blocks: [
    { kind: 'warmup', seconds: 40 },
    { kind: 'intervals', exercise: 'Jump squats', sets: 6, workSeconds: 20, restSeconds: 10 },
    { kind: 'cooldown', seconds: 40 },
  ],
};

/** The boundary without a signal: the start of the third work interval. */
const SILENT = 5;

let browser: Browser;
let api: ApiClient;
let dir = '';
let clip = '';
let score: SoundtrackScore;

beforeAll(async () => {
  dir = await mkdtemp(path.join(tmpdir(), 'roundmark-mark-it-'));
  clip = path.join(dir, 'Jump squat intervals.mp4');
  // Drift of at most 0.3 s a part: the silent boundary, placed by the plan after the one before,
  // then lands within the 0.5 s the story checks.
  score = scoreSoundtrack(expandPlan(planSchema.parse(planInput)).segments, {
    signal: 'beeps',
    seed: 11,
    leadInSeconds: 8,
    longBreak: null,
    driftSeconds: 0.3,
    silentBoundaries: [SILENT],
  });
  await renderSoundtrack(score, clip, { video: { width: 320, height: 180, fps: 10 } });
  browser = await launchBrowser();
  api = new ApiClient();
  expect((await api.signIn(DEMO.coach)).status).toBe(200);
}, 300_000);

afterAll(async () => {
  await browser?.close();
  if (dir) await rm(dir, { recursive: true, force: true });
});

describe('Mark it for me', () => {
  it('upload, mark it for me, review the uncertain boundaries, accept, save: the check is clean; publish', async () => {
    // The class and its plan exist already (made through the API: the plan builder has its own story).
    const created = await api.post('/api/lessons', { title: 'Mark it story: jump squats', advertisedMinutes: 4 });
    const lessonId = ((await created.json()) as { id: string }).id;
    const { version } = await (await api.get(`/api/lessons/${lessonId}/plan`)).json();
    expect((await api.put(`/api/lessons/${lessonId}/plan`, { version, ...planInput })).status).toBe(200);

    const context = await browser.newContext({ viewport: { width: 1280, height: 1000 } });
    const page = await context.newPage();
    const pageErrors: string[] = [];
    page.on('pageerror', (e) => pageErrors.push(e.message));
    await signInThroughForm(page, DEMO.coach);
    await page.waitForURL(BASE() + '/studio/classes');
    await page.goto(`${BASE()}/studio/classes/${lessonId}`);
    await page.locator('.uppy-Dashboard-input').first().waitFor({ state: 'attached' });

    await page.setInputFiles('.uppy-Dashboard-input', clip);
    await page.locator('.uppy-Dashboard-Item').waitFor();
    await page.locator('.uppy-StatusBar-actionBtn--upload').click();
    await page.locator('[data-state="ready"]').waitFor({ timeout: 480_000 });

    // The worker hears the recording right after packaging; wait for that state, then press the button.
    const rec = ((await (await api.get(`/api/lessons/${lessonId}/recordings`)).json()) as { recordings: { id: string }[] }).recordings[0]!;
    await expect
      .poll(async () => ((await (await api.get(`/api/recordings/${rec.id}/events?limit=1`)).json()) as { analyzed: boolean }).analyzed, { timeout: 300_000, interval: 500 })
      .toBe(true);
    await page.reload();
    await page.locator('[data-editor-ready="true"]').waitFor({ timeout: 60_000 });

    await page.getByRole('button', { name: 'Mark it for me' }).click();
    const layer = page.locator('[data-proposal]');
    await layer.waitFor({ timeout: 30_000 });
    // The proposed boundaries are drawn inside the waveform; the silent one is highlighted there.
    const waveform = page.locator('[data-waveform]');
    const markers = waveform.locator('[data-proposed-boundary]');
    await expect.poll(() => markers.count()).toBe(score.boundaries.length);
    const flagged = waveform.locator('[data-proposed-boundary][data-uncertain]');
    const flaggedIndexes = await flagged.evaluateAll((els) => els.map((el) => Number((el as HTMLElement).dataset.proposedBoundary)));
    expect(flaggedIndexes).toContain(SILENT);
    await page.screenshot({ path: `${SHOTS}/mark-it-proposal.png`, fullPage: true });

    // Review: U jumps to the next uncertain boundary and plays 3 s around it, then pauses.
    await page.locator('[data-editor]').click({ position: { x: 5, y: 5 } });
    await page.keyboard.press('u');
    const reviewing = layer.locator('[data-reviewing]');
    await reviewing.waitFor();
    const video = page.locator('video');
    await expect.poll(() => video.evaluate((v: HTMLVideoElement) => !v.paused), { timeout: 10_000 }).toBe(true);
    await expect.poll(() => video.evaluate((v: HTMLVideoElement) => v.paused), { timeout: 15_000 }).toBe(true);
    const first = await video.evaluate((v: HTMLVideoElement) => v.currentTime);
    const firstFlagged = score.boundaries[flaggedIndexes[0]!]!;
    // It played from 1.5 s before the boundary for about 3 s (timer-driven pause: generous bounds).
    expect(first).toBeGreaterThan(firstFlagged - 1.5);
    expect(first).toBeLessThan(firstFlagged + 4);
    await expect.poll(() => waveform.locator('[data-proposed-boundary][data-reviewing-now]').count()).toBe(1);
    await page.screenshot({ path: `${SHOTS}/mark-it-review.png`, fullPage: true });

    await layer.getByRole('button', { name: 'Accept proposal' }).click();
    await layer.waitFor({ state: 'detached' });
    expect(await markers.count()).toBe(0);
    // Undo brings back the marks from before (none here); redo adopts the proposal again.
    const segments = page.locator('[data-segment-id]');
    expect(await segments.count()).toBe(score.boundaries.length - 1);
    await page.locator('[data-editor]').click({ position: { x: 5, y: 5 } });
    await page.keyboard.press('Control+z');
    await expect.poll(() => segments.count()).toBe(0);
    await page.keyboard.press('Control+Shift+z');
    await expect.poll(() => segments.count()).toBe(score.boundaries.length - 1);
    await expect.poll(() => page.locator('[data-check-summary]').textContent()).toMatch(/^0 errors/);
    await page.getByRole('button', { name: 'Save timeline' }).click();
    await page.locator('[data-save-state="saved"][data-dirty="false"]').waitFor();
    await page.screenshot({ path: `${SHOTS}/mark-it-accepted.png`, fullPage: true });

    // Stored: the proposal's segments, on the true boundaries (within 0.5 s), and the server's check agrees.
    const stored = (await (await api.get(`/api/lessons/${lessonId}/timeline`)).json()) as { segments: { startSeconds: number; endSeconds: number }[] };
    const starts = [...stored.segments].sort((a, b) => a.startSeconds - b.startSeconds);
    const marks = [...starts.map((s) => s.startSeconds), starts[starts.length - 1]!.endSeconds];
    expect(matchedShare(score.boundaries, marks)).toBeGreaterThanOrEqual(0.97);
    const check = (await (await api.post(`/api/lessons/${lessonId}/check`)).json()) as { findings: { severity: string }[] };
    expect(check.findings.filter((f) => f.severity === 'error')).toEqual([]);

    // Publish from the class page's panel (the short generated class is advertised at 4 minutes:
    // any length warning is acknowledged, as a coach would). The page is opened afresh, as after a save.
    await page.reload();
    await page.getByTestId('publish-panel').waitFor();
    const panel = page.getByTestId('publish-panel');
    const acknowledge = panel.getByLabel('I reviewed these warnings; publish anyway.');
    if (await acknowledge.count()) await acknowledge.check();
    await panel.getByRole('button', { name: 'Publish now' }).click();
    await page.getByTestId('publish-panel').getByText(/Live in the library as version 1/).waitFor();
    expect(((await (await api.get(`/api/lessons/${lessonId}`)).json()) as { state: string }).state).toBe('published');
    await page.screenshot({ path: `${SHOTS}/mark-it-published.png`, fullPage: true });

    expect(pageErrors).toEqual([]);
    await context.close();
  }, 900_000);
});
