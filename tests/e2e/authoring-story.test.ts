// A coach builds a class in the browser from nothing, through the real app, database and
// Chromium, touching only the page's controls (the API is read only to check what was stored):
// create the class, build its plan in the Plan section (typing, field messages in the schema's
// words, reorder by keyboard and by drag, duplicate, remove), save, and meet a stale save.
// Screenshots go to test-results/screenshots/authoring-*.png.
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { type ApiClient, BASE, DEMO, signedIn } from '../helpers/api-client';
import { launchBrowser, SHOTS } from '../helpers/browser';
import { makeClip } from '../helpers/media-files';
import { timelineToCsv } from '~/lib/timeline/timeline-csv';
import { readTimelineFile } from '~/lib/editor/timeline-file';
import { signedInPage } from '../helpers/role-pages';

let browser: Browser;
let api: ApiClient;
let classUrl = '';
let dir = '';
/** Clicks and key presses the story needed, counted as it goes (reported in the note). */
const effort = { clicks: 0, keys: 0 };

beforeAll(async () => {
  api = await signedIn(DEMO.coach);
  browser = await launchBrowser();
  dir = await mkdtemp(path.join(tmpdir(), 'authoring-story-'));
}, 60_000);

afterAll(async () => {
  console.log(`authoring story effort: ${effort.clicks} clicks, ${effort.keys} keys typed or pressed`);
  await browser?.close();
  if (dir) await rm(dir, { recursive: true, force: true });
});

const signInPage = (email: string, viewport = { width: 1366, height: 900 }) => signedInPage(browser, email, { viewport });

/** Types into a field and counts the keys. */
async function type(page: Page, locator: ReturnType<Page['locator']>, text: string) {
  await locator.fill(text);
  effort.keys += text.length;
}
async function click(locator: ReturnType<Page['locator']>) {
  await locator.click();
  effort.clicks += 1;
}

/** Drags block `from`'s handle with the mouse onto block `to` (pointer events, as a person would). */
async function dragBlock(page: Page, from: number, to: number) {
  // A tall window keeps both blocks on screen while the mouse moves.
  const before = page.viewportSize()!;
  await page.setViewportSize({ width: before.width, height: 2400 });
  await page.locator('[data-plan-block]').nth(from).scrollIntoViewIfNeeded();
  const handle = (await page.locator('[data-plan-block] [data-drag-handle]').nth(from).boundingBox())!;
  const target = (await page.locator('[data-plan-block]').nth(to).boundingBox())!;
  await page.mouse.move(handle.x + handle.width / 2, handle.y + handle.height / 2);
  await page.mouse.down();
  const steps = 8;
  for (let i = 1; i <= steps; i++) {
    await page.mouse.move(handle.x + handle.width / 2, handle.y + ((target.y + target.height / 2 - handle.y) * i) / steps);
  }
  await page.mouse.up();
  effort.clicks += 1;
  await page.setViewportSize(before);
}

const blockKinds = (page: Page) => page.locator('[data-plan-block]').evaluateAll((els) => els.map((e) => e.getAttribute('data-plan-block')));
const planOf = async (id: string) => (await (await api.get(`/api/lessons/${id}/plan`)).json()) as { version: number; plan: { blocks: { kind: string; stations?: { exercise: string }[] }[] } | null; schedule: { totals: { classSeconds: number } } | null };

describe('a coach authors a class from an empty one', () => {
  let lessonId = '';

  it('creates the class and builds, reorders and saves its plan with the real controls', async () => {
    const { context, page } = await signInPage(DEMO.coach);
    const pageErrors: string[] = [];
    page.on('pageerror', (e) => pageErrors.push(e.message));
    await page.goto(BASE() + '/studio/classes');
    await type(page, page.getByLabel('Title'), 'Lunchtime Sides and Ladders');
    await type(page, page.getByLabel('Advertised length (minutes)'), '20');
    await click(page.getByRole('button', { name: 'Create class' }));
    await page.waitForURL(/\/studio\/classes\/[0-9a-f-]{36}/);
    classUrl = page.url();
    lessonId = classUrl.split('/').pop()!;
    const plan = page.locator('[data-plan-builder]');
    await plan.waitFor();
    expect(await blockKinds(page)).toEqual(['warmup']);

    // A circuit: its stations start empty, and the schema's own words show at each field.
    await click(page.getByRole('button', { name: '+ Circuit' }));
    const circuit = page.locator('[data-plan-block="circuit"]');
    await expect.poll(() => circuit.locator('[data-field-error]').first().textContent()).toBe('The exercise needs a name.');
    const stations = circuit.locator('[data-exercise-input]');
    await type(page, stations.nth(0), 'Goblet squat');
    await type(page, stations.nth(1), 'Push-up');
    await type(page, stations.nth(2), 'Sideways lunge test move');
    // A name the library lacks is marked new; a known one is not.
    await expect.poll(() => circuit.locator('[data-new-exercise]').count()).toBeGreaterThanOrEqual(1);
    // A bad number: the message is the schema's, at the field.
    const rounds = circuit.getByLabel('Rounds');
    await type(page, rounds, '0');
    await expect.poll(() => circuit.locator('[data-field-error]').allTextContents()).toContain('A circuit needs at least 1 round.');
    await type(page, rounds, '3');
    await expect.poll(() => circuit.locator('[data-field-error]').count()).toBe(0);
    // Planned length of the block: 3 × 3 × (40 + 20) − 3 × 20 (round break replaces / final rest dropped) + 2 × 60 = 600 s.
    expect(await circuit.locator('[data-block-length]').textContent()).toBe('10:00');

    // A cool-down, then an intervals block moved above it with the keyboard, then a talk
    // duplicated and removed, and the cool-down dragged to the end.
    await click(page.getByRole('button', { name: '+ Cool-down' }));
    await click(page.getByRole('button', { name: '+ Talk' }));
    expect(await blockKinds(page)).toEqual(['warmup', 'circuit', 'cooldown', 'talk']);
    await click(page.getByRole('button', { name: 'Duplicate Talk (block 4)' }));
    expect(await blockKinds(page)).toEqual(['warmup', 'circuit', 'cooldown', 'talk', 'talk']);
    await click(page.getByRole('button', { name: 'Remove Talk (block 5)' }));
    await page.getByRole('button', { name: 'Move Talk (block 4) up' }).focus();
    await page.keyboard.press('Alt+ArrowUp');
    effort.keys += 1;
    expect(await blockKinds(page)).toEqual(['warmup', 'circuit', 'talk', 'cooldown']);
    await click(page.getByRole('button', { name: 'Move Talk (block 3) up' }));
    expect(await blockKinds(page)).toEqual(['warmup', 'talk', 'circuit', 'cooldown']);
    // Drag the talk (block 2) onto the cool-down (block 4): it lands at position 4.
    await dragBlock(page, 1, 3);
    expect(await blockKinds(page)).toEqual(['warmup', 'circuit', 'cooldown', 'talk']);
    await click(page.getByRole('button', { name: 'Remove Talk (block 4)' }));

    // Live total against the advertised 20 min ± 10 %: 5:00 + 10:00 + 3:00 = 18:00, within.
    await expect.poll(() => plan.locator('[data-planned-total]').textContent()).toBe('18:00');
    expect(await plan.locator('[data-length-ok]').count()).toBe(1);

    // A Tabata block from the built-in formats, added to the plan, its move named, moved above the cool-down.
    await page.getByLabel('Start from a template or copy the plan of another class').selectOption({ label: 'Tabata 8 × 20/10 s' });
    effort.clicks += 2;
    await click(page.getByRole('button', { name: 'Add its blocks' }));
    expect(await blockKinds(page)).toEqual(['warmup', 'circuit', 'cooldown', 'intervals']);
    const tabata = page.locator('[data-plan-block="intervals"]');
    expect(await tabata.locator('[data-field-error]').first().textContent()).toBe('The exercise needs a name.');
    await type(page, tabata.getByLabel('Exercise'), 'Skater hop');
    await click(page.getByRole('button', { name: 'Move Intervals (block 4) up' }));
    expect(await blockKinds(page)).toEqual(['warmup', 'circuit', 'intervals', 'cooldown']);
    // 8 × 20 s work and 7 × 10 s rest (this plan ends blocks on work): 230 s.
    expect(await tabata.locator('[data-block-length]').textContent()).toBe('3:50');

    // A ladder round: round 3 of the circuit works 50 s instead of 40 at each of its 3 stations (+30 s).
    await click(circuit.getByRole('button', { name: 'Change a round' }));
    const change = circuit.locator('[data-round-change]');
    await type(page, change.getByLabel('Round', { exact: true }), '3');
    await type(page, change.getByLabel('Work (s)', { exact: true }), '50');
    expect(await circuit.locator('[data-block-length]').textContent()).toBe('10:30');
    // 5:00 + 10:30 + 3:50 + 3:00 = 22:20: past 20 min + 10 %, and the page says so before any check.
    await expect.poll(() => plan.locator('[data-planned-total]').textContent()).toBe('22:20');
    expect(await plan.locator('[data-length-warning]').count()).toBe(1);
    await type(page, page.locator('[data-plan-block="warmup"]').getByLabel('Length (seconds)'), '280');
    await expect.poll(() => plan.locator('[data-planned-total]').textContent()).toBe('22:00');
    expect(await plan.locator('[data-length-ok]').count()).toBe(1);
    await page.screenshot({ path: `${SHOTS}/authoring-plan-desktop.png`, fullPage: true });

    expect(await page.locator('[data-editor]').getByText('Add a plan, then come back').count()).toBe(1);
    await click(page.getByRole('button', { name: 'Save plan' }));
    await expect.poll(() => plan.locator('[data-plan-save-state]').getAttribute('data-plan-save-state')).toBe('saved');
    const stored = await planOf(lessonId);
    expect(stored.plan?.blocks.map((b) => b.kind)).toEqual(['warmup', 'circuit', 'intervals', 'cooldown']);
    expect(stored.plan?.blocks[1]?.stations?.map((s) => s.exercise)).toEqual(['Goblet squat', 'Push-up', 'Sideways lunge test move']);
    expect(stored.schedule?.totals.classSeconds).toBe(22 * 60);

    // The plan becomes one of the studio's templates.
    await type(page, page.getByLabel('Save this plan as a studio template'), 'Sides and ladders test template');
    await click(page.getByRole('button', { name: 'Save as template' }));
    await page.getByText('Saved “Sides and ladders test template” to this studio’s templates.').waitFor();
    // Phone width: the plan section fits without sideways scrolling.
    await page.setViewportSize({ width: 390, height: 844 });
    await page.locator('[data-plan-section]').screenshot({ path: `${SHOTS}/authoring-plan-phone.png` });
    const fits = await page.locator('[data-plan-section]').evaluate((el) => ({ scroll: el.scrollWidth, client: el.clientWidth, right: el.getBoundingClientRect().right }));
    expect(fits.scroll).toBeLessThanOrEqual(fits.client);
    expect(fits.right).toBeLessThanOrEqual(390);
    await page.setViewportSize({ width: 1366, height: 900 });
    // The timeline editor on the same page now checks against the new plan.
    await expect.poll(() => page.locator('[data-editor]').getByText('Add a plan, then come back').count()).toBe(0);
    expect(pageErrors).toEqual([]);
    console.log(`authoring story effort, empty class to saved plan and template: ${effort.clicks} clicks, ${effort.keys} keys`);
    await context.close();
  }, 120_000);

  it('a stale plan save answers 409 and the page offers to reload, keeping the newer plan', async () => {
    const a = await signInPage(DEMO.coach);
    const b = await signInPage(DEMO.editor);
    await a.page.goto(classUrl);
    await b.page.goto(classUrl);
    await a.page.locator('[data-plan-builder]').waitFor();
    await b.page.locator('[data-plan-builder]').waitFor();
    await b.page.locator('[data-plan-block="cooldown"]').getByLabel('Length (seconds)').fill('240');
    await b.page.getByRole('button', { name: 'Save plan' }).click();
    await expect.poll(() => b.page.locator('[data-plan-save-state]').getAttribute('data-plan-save-state')).toBe('saved');
    await a.page.locator('[data-plan-block="cooldown"]').getByLabel('Length (seconds)').fill('120');
    await a.page.getByRole('button', { name: 'Save plan' }).click();
    await expect.poll(() => a.page.locator('[data-plan-save-state]').getAttribute('data-plan-save-state')).toBe('conflict');
    await a.page.getByRole('button', { name: 'Reload to see their changes' }).click();
    await a.page.locator('[data-plan-block="cooldown"]').waitFor();
    expect(await a.page.locator('[data-plan-block="cooldown"]').getByLabel('Length (seconds)').inputValue()).toBe('240');
    await a.context.close();
    await b.context.close();
  }, 120_000);

  it('uploads a generated recording; the open editor loads it once ready, without a reload', async () => {
    // A short generated clip (invented test media): the story stops at the editor picking it up.
    const clip = path.join(dir, 'class.mp4');
    await makeClip(clip, { seconds: 20, size: '320x180' });
    const { context, page } = await signInPage(DEMO.coach);
    await page.goto(classUrl);
    await page.locator('[data-editor]').waitFor();
    await page.locator('[data-no-recording]').waitFor();
    let navigations = 0;
    page.on('framenavigated', (f) => {
      if (f === page.mainFrame()) navigations += 1;
    });
    await page.locator('.uppy-Dashboard-input').first().waitFor({ state: 'attached' });
    await page.setInputFiles('.uppy-Dashboard-input', clip);
    await click(page.locator('.uppy-StatusBar-actionBtn--upload'));
    // The editor notices the recording when the worker has made it ready, and shows the video.
    await page.locator('[data-editor] video').waitFor({ timeout: 180_000 });
    await page.locator('[data-editor-ready="true"]').waitFor({ timeout: 60_000 });
    await expect.poll(() => page.locator('[data-editor] video').evaluate((v: HTMLVideoElement) => v.readyState), { timeout: 30_000 }).toBeGreaterThanOrEqual(1);
    expect(await page.locator('[data-playhead]').textContent()).toMatch(/\/ 0:20\.0/);
    expect(navigations).toBe(0);
    // A segment of any kind at the playhead (0:00), 30 s long but clamped to the 20 s recording; undo takes it back.
    await page.getByLabel('Kind to insert').selectOption('warmup');
    await click(page.getByRole('button', { name: 'Insert here' }));
    await page.locator('[data-segment-list] summary').click();
    await expect.poll(() => page.locator('[data-segment-id]').allTextContents()).toEqual([expect.stringMatching(/^Warm-up/)]);
    expect(await page.locator('[data-selected-times]').textContent()).toMatch(/^0:00\.0 – 0:20\.0/);
    await click(page.getByRole('button', { name: 'Undo' }));
    await expect.poll(() => page.locator('[data-segment-id]').count()).toBe(0);

    // Import a CSV (invented marks written by the app's own CSV writer): a preview first, then
    // replace, then undo. An empty file and a bare WEBVTT header are refused and change nothing.
    const csv = path.join(dir, 'marks.csv');
    await writeFile(csv, timelineToCsv({
      segments: [
        { id: 'w1', kind: 'warmup', startSeconds: 0, endSeconds: 8 },
        { id: 'k1', kind: 'work', startSeconds: 8, endSeconds: 18, exercise: 'Goblet squat', round: 1 },
      ],
      cues: [],
    }));
    await page.setInputFiles('[data-import-input]', csv);
    effort.clicks += 1;
    await expect.poll(() => page.locator('[data-import-counts]').textContent()).toBe('2 added, 0 removed, 0 moved or changed');
    expect(await page.locator('[data-segment-id]').count()).toBe(0); // nothing replaced yet
    await click(page.getByRole('button', { name: 'Replace the marks' }));
    await expect.poll(() => page.locator('[data-segment-id]').count()).toBe(2);
    await click(page.getByRole('button', { name: 'Undo' }));
    await expect.poll(() => page.locator('[data-segment-id]').count()).toBe(0);
    for (const [name, text, message] of [
      ['empty.csv', '', 'The file is empty.'],
      ['bare.vtt', 'WEBVTT\n', 'The file has no segments'],
    ] as const) {
      await writeFile(path.join(dir, name), text);
      await page.setInputFiles('[data-import-input]', path.join(dir, name));
      await expect.poll(() => page.locator('[data-import-problem]').textContent()).toContain(message);
      expect(await page.locator('[data-import-preview]').count()).toBe(0);
    }
    // Export: the marks on screen as CSV, read back by the same importer.
    await page.setInputFiles('[data-import-input]', csv);
    await click(page.getByRole('button', { name: 'Replace the marks' }));
    const [download] = await Promise.all([page.waitForEvent('download'), click(page.getByRole('button', { name: 'Export CSV' }))]);
    const exported = readTimelineFile(await readFile((await download.path())!, 'utf8'));
    expect(exported.ok && exported.timeline.segments.map((x) => [x.id, x.startSeconds, x.endSeconds])).toEqual([['w1', 0, 8], ['k1', 8, 18]]);
    await page.screenshot({ path: `${SHOTS}/authoring-recording-ready.png`, fullPage: true });
    await context.close();
  }, 300_000);
});

// The whole job from "New class" to a member seeing it, only through the page's controls: a short
// plan, a generated 117 s clip (invented test input: the recording stopped 3 s before the planned
// 2:00 ended), the plan laid out as marks, the check's fix applied, a frame as cover, tags and
// cautions, publish; then a member finds it in the library. Every click and key is counted.
describe('from an empty class to published', () => {
  it('a coach does the whole job in the browser and a member sees the class in the library', async () => {
    const story = { clicks: 0, keys: 0 };
    const typeIn = async (locator: ReturnType<Page['locator']>, text: string) => {
      await locator.fill(text);
      story.keys += text.length;
    };
    const press = async (locator: ReturnType<Page['locator']>) => {
      await locator.click();
      story.clicks += 1;
    };
    const title = `Story Squat Jumps ${Date.now().toString(36)}`;
    const clip = path.join(dir, 'story.mp4');
    await makeClip(clip, { seconds: 117, size: '320x180' });

    const { context, page } = await signInPage(DEMO.coach);
    const pageErrors: string[] = [];
    page.on('pageerror', (e) => pageErrors.push(e.message));
    // Classes → New class: title and a first guess at the length.
    await page.goto(BASE() + '/studio');
    await press(page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Classes' }).first());
    await press(page.getByRole('link', { name: 'New class' }));
    await typeIn(page.getByLabel('Title'), title);
    await typeIn(page.getByLabel('Advertised length (minutes)'), '5');
    await press(page.getByRole('button', { name: 'Create class' }));
    await page.waitForURL(/\/studio\/classes\/[0-9a-f-]{36}/);
    const storyLessonId = page.url().split('/').pop()!;

    // Plan: warm-up 20 s, 3 × 20 s squat jumps with 10 s rest, cool-down 20 s = 2:00.
    const plan = page.locator('[data-plan-builder]');
    await plan.waitFor();
    await typeIn(page.locator('[data-plan-block="warmup"]').getByLabel('Length (seconds)'), '20');
    await press(page.getByRole('button', { name: '+ Intervals' }));
    const intervals = page.locator('[data-plan-block="intervals"]');
    await typeIn(intervals.getByLabel('Exercise'), 'Squat jump');
    await typeIn(intervals.getByLabel('Sets'), '3');
    await press(page.getByRole('button', { name: '+ Cool-down' }));
    await typeIn(page.locator('[data-plan-block="cooldown"]').getByLabel('Length (seconds)'), '20');
    await expect.poll(() => plan.locator('[data-planned-total]').textContent(), { timeout: 10_000 }).toBe('2:00');
    expect(await plan.locator('[data-length-warning]').count()).toBe(1); // 2:00 against the advertised 5 min
    await press(page.getByRole('button', { name: 'Save plan' }));
    await expect.poll(() => plan.locator('[data-plan-save-state]').getAttribute('data-plan-save-state'), { timeout: 30_000 }).toBe('saved');

    // Recording: through the upload control; the editor picks it up when the worker made it ready.
    await page.locator('.uppy-Dashboard-input').first().waitFor({ state: 'attached' });
    await page.setInputFiles('.uppy-Dashboard-input', clip);
    story.clicks += 2; // "choose a file" and picking the file in the system dialog
    await press(page.locator('.uppy-StatusBar-actionBtn--upload'));
    await page.locator('[data-editor-ready="true"]').waitFor({ timeout: 240_000 });
    await page.locator('[data-editor-video]').waitFor({ timeout: 60_000 });
    await expect.poll(() => page.locator('[data-editor-video]').evaluate((v: HTMLVideoElement) => v.readyState), { timeout: 60_000 }).toBeGreaterThanOrEqual(1);

    // Marks: the plan laid out from the playhead (0:00) with the planned lengths.
    await press(page.getByRole('button', { name: 'Lay out plan from here' }));
    await page.locator('[data-segment-list] summary').click();
    story.clicks += 1;
    await expect.poll(() => page.locator('[data-segment-id]').count(), { timeout: 10_000 }).toBe(7); // warm-up, 3 work, 2 rest, cool-down
    // The check: the cool-down runs past the end of the recording; its suggested fix ends it there.
    await expect.poll(() => page.locator('[data-check-summary]').textContent(), { timeout: 10_000 }).toMatch(/^1 error/);
    const fixes = page.getByRole('button', { name: /^Apply fix: / });
    expect(await fixes.count()).toBe(1);
    expect(await fixes.first().getAttribute('aria-label')).toContain('after the recording ends at 1:57');
    await press(fixes.first());
    await expect.poll(() => page.locator('[data-check-summary]').textContent(), { timeout: 10_000 }).toMatch(/^0 errors/);
    expect(await fixes.count()).toBe(0);
    await press(page.getByRole('button', { name: 'Save timeline' }));
    await page.locator('[data-save-state="saved"][data-dirty="false"]').waitFor({ timeout: 30_000 });

    // Cover: choosing the second work interval in the list moves the playhead (and the video) to its start.
    await press(page.locator('[data-segment-id]', { hasText: /^Work/ }).nth(1));
    await expect.poll(() => page.locator('[data-editor-video]').evaluate((v: HTMLVideoElement) => !v.seeking && v.readyState >= 2 && v.currentTime > 0), { timeout: 30_000 }).toBe(true);
    await press(page.getByRole('button', { name: 'Use this frame as cover' }));
    await page.locator('[data-cover-picker]').getByRole('status').filter({ hasText: /is the cover now\.$/ }).waitFor({ timeout: 120_000 });
    const coverUrl = await page.locator('[data-current-cover]').getAttribute('data-current-cover');
    expect(coverUrl).toMatch(/\/cover\/[0-9a-f-]{36}\.jpg$/);

    // Details: the real length, tags (equipment and focus) and a caution for this class.
    const details = page.locator('form[data-lesson-version]');
    await typeIn(details.getByLabel('Advertised length (minutes)'), '2');
    await typeIn(details.getByLabel('Equipment'), 'mat');
    await typeIn(details.getByLabel('Focus'), 'legs, cardio');
    await typeIn(details.getByLabel('Cautions for this class'), 'Land softly; step instead of jumping if your knees hurt.');
    await press(details.getByRole('button', { name: 'Save details' }));
    await page.getByRole('status').filter({ hasText: 'Saved.' }).waitFor({ timeout: 30_000 });

    // Publish: any warning the check still has is read and acknowledged, as a coach would.
    const panel = page.getByTestId('publish-panel');
    const acknowledge = panel.getByLabel('I reviewed these warnings; publish anyway.');
    if (await acknowledge.count()) await press(acknowledge);
    await press(panel.getByRole('button', { name: 'Publish now' }));
    await page.getByRole('status').filter({ hasText: /^Published as version 1\. Members see it in the library now\.$/ }).waitFor({ timeout: 60_000 });
    await page.screenshot({ path: `${SHOTS}/authoring-story-published.png`, fullPage: true });
    expect(pageErrors).toEqual([]);
    console.log(`empty class to published: ${story.clicks} clicks, ${story.keys} keys typed or pressed`);
    const stored = await (await api.get(`/api/lessons/${storyLessonId}`)).json();
    expect(stored).toMatchObject({ state: 'published', advertisedMinutes: 2, equipment: ['mat'], focus: ['legs', 'cardio'] });
    await context.close();

    // A member finds it in the library, with its cover, and opens it: chapters and the caution show.
    const member = await signInPage(DEMO.member);
    await member.page.goto(BASE() + '/');
    await member.page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Library' }).first().click();
    await member.page.getByLabel('Search').fill(title);
    await member.page.getByRole('button', { name: 'Show classes' }).click();
    const card = member.page.locator(`[data-class-card="${stored.slug}"]`);
    await card.waitFor({ timeout: 30_000 });
    expect(await card.locator('img[data-cover]').getAttribute('src')).toBe(coverUrl);
    await card.getByRole('link').first().click();
    await member.page.getByRole('heading', { name: title }).waitFor({ timeout: 30_000 });
    const chapters = member.page.getByRole('list', { name: 'Chapters' });
    await chapters.waitFor({ timeout: 30_000 });
    expect(await chapters.textContent()).toContain('Squat jump');
    expect(await member.page.getByText('Land softly; step instead of jumping if your knees hurt.').count()).toBeGreaterThanOrEqual(1);
    await member.page.screenshot({ path: `${SHOTS}/authoring-story-member.png`, fullPage: true });
    await member.context.close();
  }, 600_000);
});

