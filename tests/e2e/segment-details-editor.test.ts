// An editor corrects a mark's round and side in the timeline editor through the real controls
// (typing with Enter, the side list by keyboard), saves, reloads and finds them kept, and the
// check's finding about that mark is gone; the AMRAP's mark shows the plan's exercise list. The
// class, its plan, marks and generated recording are invented for the test and set up through
// the API; the editor's part is done in the page only. A class of its own, so no demo state changes.
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { type ApiClient, BASE, DEMO, signedIn } from '../helpers/api-client';
import { launchBrowser, SHOTS } from '../helpers/browser';
import { makeClip } from '../helpers/media-files';
import { signedInPage } from '../helpers/role-pages';
import { uploadWhole, waitForRecording } from '../helpers/upload-flow';

let browser: Browser;
let coach: ApiClient;
let dir = '';
let lessonId = '';

// Worked by hand: Segment e2e lunge per side, 10 s each side, no switch pause, 2 rounds, 5 s
// round break in place of the last rest: round 1 left 0–10, right 10–20, break 20–25; round 2
// left 25–35, right 35–45 (final rest dropped); then an AMRAP of 15 s, 45–60. 60 s in all.
const PLAN = {
  blocks: [
    { kind: 'circuit', rounds: 2, roundBreakSeconds: 5, stations: [{ exercise: 'Segment e2e lunge', workSeconds: 10, restSeconds: 5, perSide: true }] },
    { kind: 'amrap', seconds: 15, exercises: ['Segment e2e thruster', 'Segment e2e sit-up'] },
  ],
};
// The mark at 0:25 is round 2's left side, but it is marked round 1, right side (the mistake).
const TIMELINE = {
  segments: [
    { id: 'l1', kind: 'work', startSeconds: 0, endSeconds: 10, exercise: 'Segment e2e lunge', round: 1, side: 'left' },
    { id: 'r1', kind: 'work', startSeconds: 10, endSeconds: 20, exercise: 'Segment e2e lunge', round: 1, side: 'right' },
    { id: 'b1', kind: 'round-break', startSeconds: 20, endSeconds: 25, round: 1 },
    { id: 'l2', kind: 'work', startSeconds: 25, endSeconds: 35, exercise: 'Segment e2e lunge', round: 1, side: 'right' },
    { id: 'r2', kind: 'work', startSeconds: 35, endSeconds: 45, exercise: 'Segment e2e lunge', round: 2, side: 'right' },
    { id: 'a', kind: 'work', startSeconds: 45, endSeconds: 60, format: 'amrap' },
  ],
  cues: [],
};

beforeAll(async () => {
  coach = await signedIn(DEMO.coach);
  browser = await launchBrowser();
  dir = await mkdtemp(path.join(tmpdir(), 'segment-details-'));
  const lesson = await (await coach.post('/api/lessons', { title: 'Segment side and round check', advertisedMinutes: 1, impact: 'low' })).json();
  lessonId = lesson.id;
  expect((await coach.put(`/api/lessons/${lessonId}/plan`, { version: lesson.version, ...PLAN })).status).toBe(200);
  expect((await coach.put(`/api/lessons/${lessonId}/timeline`, { version: 0, ...TIMELINE })).status).toBe(200);
  const clip = path.join(dir, 'class.mp4');
  await makeClip(clip, { seconds: 60, size: '320x180' });
  const { recordingId } = await uploadWhole(coach, lessonId, 'class.mp4', new Uint8Array(await readFile(clip)));
  expect((await waitForRecording(coach, recordingId)).state).toBe('ready');
}, 300_000);

afterAll(async () => {
  await browser?.close();
  if (dir) await rm(dir, { recursive: true, force: true });
});

const findings = (page: Page) => page.locator('[data-finding]').evaluateAll((els) => els.map((e) => `${e.getAttribute('data-finding')}: ${e.textContent}`));
const selectedTimes = (page: Page) => page.locator('[data-selected-times]').textContent();

async function openEditor(page: Page): Promise<void> {
  await page.goto(`${BASE()}/studio/classes/${lessonId}`);
  await page.locator('[data-editor-ready="true"]').waitFor({ timeout: 60_000 });
}

describe('editing a mark\'s round and side', () => {
  it('sets them through the inspector, keeps them after save and reload, and the finding goes away', async () => {
    const { context, page } = await signedInPage(browser, DEMO.editor, { viewport: { width: 1280, height: 900 } });
    const pageErrors: string[] = [];
    page.on('pageerror', (e) => pageErrors.push(e.message));
    await openEditor(page);

    // The check names the mark at 0:25 as the wrong side (the plan has the left side there).
    const wrong = page.locator('[data-finding="unexpected-station"]', { hasText: '(right side) at 0:25.0' });
    await wrong.waitFor();
    expect(await wrong.textContent()).toContain('it expects Segment e2e lunge, left side (round 2, station 1)');
    await wrong.getByRole('button', { name: /^Go to/ }).click();
    await expect.poll(() => selectedTimes(page)).toBe('0:25.0 – 0:35.0 · 10 s · round 1 · right side');

    const inspector = page.locator('[data-inspector="segment"]');
    // Round by keyboard: type the number, Enter applies it.
    const round = inspector.getByLabel('Round', { exact: true });
    await round.click();
    await round.press('Control+a');
    await round.press('2');
    await round.press('Enter');
    await expect.poll(() => selectedTimes(page)).toBe('0:25.0 – 0:35.0 · 10 s · round 2 · right side');
    // Still the wrong side: the finding stays until the side is right.
    expect((await findings(page)).some((f) => f.includes('(right side) at 0:25.0'))).toBe(true);
    // Side by keyboard on the list: from "Right", one up is "Left".
    const side = inspector.getByLabel('Side');
    await side.focus();
    await side.press('ArrowUp');
    await expect.poll(() => side.inputValue()).toBe('left');
    await expect.poll(() => selectedTimes(page)).toBe('0:25.0 – 0:35.0 · 10 s · round 2 · left side');
    await expect.poll(async () => (await findings(page)).filter((f) => f.includes('0:25.0'))).toEqual([]);
    expect(await page.locator('[data-finding][data-severity="error"]').count()).toBe(0);

    // The AMRAP mark shows what members repeat, from the plan.
    await page.locator('[data-segment-list] summary').click();
    await page.locator('[data-segment-id="a"]').click();
    await expect.poll(() => page.locator('[data-amrap-exercises] li').allTextContents()).toEqual(['Segment e2e thruster', 'Segment e2e sit-up']);
    await page.screenshot({ path: `${SHOTS}/editor-segment-side-round.png`, fullPage: true });

    await page.getByRole('button', { name: 'Save timeline' }).click();
    await page.locator('[data-save-state="saved"][data-dirty="false"]').waitFor();
    const stored = (await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json()) as { segments: { id: string; round?: number; side?: string }[] };
    expect(stored.segments.find((s) => s.id === 'l2')).toMatchObject({ round: 2, side: 'left' });

    await page.reload();
    await page.locator('[data-editor-ready="true"]').waitFor({ timeout: 60_000 });
    await page.locator('[data-segment-list] summary').click();
    await page.locator('[data-segment-id="l2"]').click();
    await expect.poll(() => selectedTimes(page)).toBe('0:25.0 – 0:35.0 · 10 s · round 2 · left side');
    expect(await page.locator('[data-inspector="segment"]').getByLabel('Side').inputValue()).toBe('left');
    expect(await page.locator('[data-inspector="segment"]').getByLabel('Round', { exact: true }).inputValue()).toBe('2');
    expect((await findings(page)).filter((f) => f.includes('0:25.0'))).toEqual([]);
    const check = (await (await coach.post(`/api/lessons/${lessonId}/check`)).json()) as { ok: boolean; findings: { code: string }[] };
    expect(check.findings.map((f) => f.code)).not.toContain('unexpected-station');
    expect(check.ok).toBe(true);
    expect(pageErrors).toEqual([]);
    await context.close();
  }, 180_000);
});
