// The coach's "Mark it for me" story through the real app, worker and Chromium: a generated
// recording (invented for the test: a short intervals class with timer beeps, music and
// chatter, see lib/media/class-soundtrack.ts) is uploaded with the class page's widget, the
// coach presses "Mark it for me", reviews the uncertain boundaries with U, accepts, saves, and
// the check is clean. The API is read only to wait for the worker and to check what was stored.
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

let browser: Browser;
let api: ApiClient;
let dir = '';
let clip = '';
let score: SoundtrackScore;

beforeAll(async () => {
  dir = await mkdtemp(path.join(tmpdir(), 'roundmark-mark-it-'));
  clip = path.join(dir, 'Jump squat intervals.mp4');
  score = scoreSoundtrack(expandPlan(planSchema.parse(planInput)).segments, { signal: 'beeps', seed: 11, leadInSeconds: 8, longBreak: null });
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
  it('upload, mark it for me, review the uncertain boundaries, accept, save: the check is clean', async () => {
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
    const markers = layer.getByRole('listitem');
    expect(await markers.count()).toBe(score.boundaries.length);
    await page.screenshot({ path: `${SHOTS}/mark-it-proposal.png`, fullPage: true });

    // Review: U plays around the next uncertain boundary (or, with none, the button says so by being disabled).
    const uncertain = await layer.locator('[data-uncertain]').count();
    if (uncertain > 0) {
      await page.locator('[data-editor]').click({ position: { x: 5, y: 5 } });
      await page.keyboard.press('u');
      await layer.locator('[data-reviewing]').waitFor();
    } else {
      expect(await layer.getByRole('button', { name: 'Next uncertain (U)' }).isDisabled()).toBe(true);
    }

    await layer.getByRole('button', { name: 'Accept proposal' }).click();
    await layer.waitFor({ state: 'detached' });
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

    // Undo restores the marks from before the proposal (none here).
    await page.keyboard.press('Control+z');
    await expect.poll(() => page.locator('[data-save-state]').getAttribute('data-dirty')).toBe('true');
    expect(pageErrors).toEqual([]);
    await context.close();
  }, 900_000);
});
