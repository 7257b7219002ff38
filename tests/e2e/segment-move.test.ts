// Moving a whole segment in the timeline editor with the real mouse and the real keys, on a class
// of its own (an invented 12 s clip made with ffmpeg, uploaded and processed by the real worker):
// a drag with Alt held places it freely, a drag towards another segment stops at it, a drag near a
// planned boundary snaps onto it, Ctrl+arrows move it (a neighbour sharing its edge follows), undo
// takes back one move, and the saved timeline holds the result.
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { type ApiClient, DEMO, signedIn } from '../helpers/api-client';
import { launchBrowser, SHOTS } from '../helpers/browser';
import { createSmallClass } from '../helpers/published-class';
import { signedInContext } from '../helpers/role-pages';

let browser: Browser;
let coach: ApiClient;
let dir = '';
let lessonId = '';
const title = `Segment move ${Date.now().toString(36)}`;

// The plan (SMALL_PLAN: 2 sets of 4 s work / 2 s rest) laid from the first work mark at 1 s has
// boundaries at 1, 5, 7, 11 and 13 s. The marks: work 1–3, rest 3–5 (sharing the edge at 3), a gap,
// and the segment we move, work 7–9.
const marks = {
  segments: [
    { id: 'seg-a', kind: 'work', startSeconds: 1, endSeconds: 3, exercise: 'Step-up', set: 1 },
    { id: 'seg-b', kind: 'rest', startSeconds: 3, endSeconds: 5, set: 1 },
    { id: 'seg-c', kind: 'work', startSeconds: 7, endSeconds: 9, exercise: 'Step-up', set: 2 },
  ],
  cues: [],
};

beforeAll(async () => {
  browser = await launchBrowser();
  coach = await signedIn(DEMO.coach);
  dir = await mkdtemp(join(tmpdir(), 'roundmark-segment-move-'));
  ({ lessonId } = await createSmallClass(coach, dir, title));
  const { version } = (await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json()) as { version: number };
  expect((await coach.put(`/api/lessons/${lessonId}/timeline`, { version, ...marks })).status).toBe(200);
}, 240_000);
afterAll(async () => {
  await browser?.close();
  if (lessonId) await coach.del(`/api/lessons/${lessonId}`);
  await rm(dir, { recursive: true, force: true });
});

const selectedTimes = (page: Page) => page.locator('[data-selected-times]').textContent();

/** A segment's region on the waveform, and the pixels per second it is drawn at (from its own width). */
async function regionOf(page: Page, id: string) {
  const region = page.locator(`div[part~="region"][part~="${id}"]`);
  const box = (await region.boundingBox())!;
  const stored = marks.segments.find((s) => s.id === id)!;
  return { region, perSecond: box.width / (stored.endSeconds - stored.startSeconds) };
}

/** Presses at `from` and drags sideways by `dx` pixels in small steps, as a hand does. */
async function dragBy(page: Page, from: { x: number; y: number }, dx: number) {
  await page.mouse.move(from.x, from.y);
  await page.mouse.down();
  for (let i = 1; i <= 10; i++) await page.mouse.move(from.x + (dx * i) / 10, from.y);
  await page.mouse.up();
}

describe('moving a whole segment', () => {
  it('by mouse and by keys: free, stopped at a neighbour, snapped, with neighbours following; one undo per move; saved', async () => {
    const { context, page } = await signedInContext(browser, 'editor', { width: 1366, height: 900 });
    await page.getByRole('link', { name: 'Classes' }).first().click();
    await page.getByRole('link', { name: title, exact: true }).click();
    await page.locator('[data-editor-ready="true"]').waitFor({ timeout: 60_000 });
    const { region, perSecond } = await regionOf(page, 'seg-c');
    await region.scrollIntoViewIfNeeded();
    const centre = async () => {
      const b = (await region.boundingBox())!;
      return { x: b.x + b.width / 2, y: b.y + b.height / 2 };
    };

    // 1. Alt held: no snapping, the segment lands where it was dropped, 1.5 s later (7–9 → 8.5–10.5).
    await page.keyboard.down('Alt');
    await dragBy(page, await centre(), 1.5 * perSecond);
    await page.keyboard.up('Alt');
    await expect.poll(() => selectedTimes(page)).toMatch(/^0:08\.[456] – 0:10\.[456]/);

    // 2. Towards the rest before it (ends at 5 s): dropped at about 4 s, it stops at 5 s, no overlap.
    await dragBy(page, await centre(), -4.5 * perSecond);
    await expect.poll(() => selectedTimes(page)).toMatch(/^0:05\.0 – 0:07\.0/);
    await page.locator('[data-notice]').filter({ hasText: 'Moved as far as there is room' }).waitFor({ state: 'attached' });

    // 3. Keys: Ctrl+Shift+→ moves it 1 s later and the rest sharing its start follows (3–5 → 3–6);
    // Ctrl+← moves it 0.1 s back; one Ctrl+Z takes back only that last move.
    await page.locator('[data-timeline]').focus();
    await page.keyboard.press('Control+Shift+ArrowRight');
    await expect.poll(() => selectedTimes(page)).toMatch(/^0:06\.0 – 0:08\.0/);
    await page.keyboard.press('Control+ArrowLeft');
    await expect.poll(() => selectedTimes(page)).toMatch(/^0:05\.9 – 0:07\.9/);
    await page.keyboard.press('Control+z');
    await expect.poll(() => selectedTimes(page)).toMatch(/^0:06\.0 – 0:08\.0/);

    // 4. Snapping on: dropped starting about 5.05 s, it snaps onto the planned boundary at 5 s
    // (within ten pixels); the rest before it shrinks back to 3–5.
    await dragBy(page, await centre(), -0.95 * perSecond);
    await expect.poll(() => selectedTimes(page)).toMatch(/^0:05\.0 – 0:07\.0/);
    await page.screenshot({ path: `${SHOTS}/segment-move.png` });

    // The keys help names the move keys.
    await page.getByRole('button', { name: 'Keyboard help' }).click();
    await page.locator('[data-shortcut-help]').getByText('Ctrl + → (⌘ + → on a Mac)').waitFor();

    // 5. Saved: the stored timeline holds the moves exactly.
    await page.getByRole('button', { name: 'Save timeline' }).click();
    await page.locator('[data-save-state="saved"][data-dirty="false"]').waitFor();
    const saved = (await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json()) as { segments: { id: string; startSeconds: number; endSeconds: number }[] };
    expect(saved.segments.map((s) => [s.id, s.startSeconds, s.endSeconds])).toEqual([
      ['seg-a', 1, 3],
      ['seg-b', 3, 5],
      ['seg-c', 5, 7],
    ]);
    await context.close();
  }, 180_000);
});
