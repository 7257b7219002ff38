// The timeline editor's story through the real app, database, job worker, ffmpeg and Chromium:
// the demo draft *Hill Sprints Prep* gets its recording from the real demo pipeline, then Priya
// (editor) opens it, sees the timing check's findings, fixes them (apply fix, drag, keyboard
// nudge, leave the skipped station out of the plan), saves and reloads; a second person saving
// first leads to the 409 choice; the coach then publishes it from the class page. Screenshots go to test-results/screenshots/editor-*.png.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { startQueue } from '~/server/queue';
import { queueDemoRecording } from '~/scripts/demo/demo-recording-job';
import { encodePeaks } from '~/lib/media/peaks';
import { type ApiClient, BASE, DEMO, signedIn } from '../helpers/api-client';
import { launchBrowser, SHOTS } from '../helpers/browser';
import { signedInPage } from '../helpers/role-pages';

interface Recording { id: string; state: string; isCurrent: boolean; durationSeconds: number | null; playlistUrl: string | null; peaksUrl: string | null; posterUrl: string | null; failureReason: string | null; createdAt: string }
interface StoredTimeline { version: number; segments: { id: string; kind: string; startSeconds: number; endSeconds: number; exercise?: string; round?: number }[]; cues: unknown[] }

let browser: Browser;
let api: ApiClient;
let lessonId: string;
let recording: Recording;

async function recordingsOf(id: string): Promise<Recording[]> {
  const res = await api.get(`/api/lessons/${id}/recordings`);
  expect(res.status).toBe(200);
  return ((await res.json()) as { recordings: Recording[] }).recordings;
}

async function timelineOf(id: string): Promise<StoredTimeline> {
  const res = await api.get(`/api/lessons/${id}/timeline`);
  expect(res.status).toBe(200);
  return (await res.json()) as StoredTimeline;
}

beforeAll(async () => {
  api = await signedIn(DEMO.coach);
  const { lessons } = (await (await api.get('/api/lessons')).json()) as { lessons: { id: string; slug: string }[] };
  lessonId = lessons.find((l) => l.slug === 'hill-sprints-prep')!.id;
  // The demo recording through the real pipeline: generate (ffmpeg), probe, package, peaks.
  if (!(await recordingsOf(lessonId)).some((r) => r.state === 'ready')) {
    const boss = await startQueue(process.env.DATABASE_URL!);
    await queueDemoRecording(boss, lessonId);
    await boss.stop({ graceful: true, wait: true });
  }
  const deadline = Date.now() + 6 * 60_000;
  for (;;) {
    const list = await recordingsOf(lessonId);
    const ready = list.find((r) => r.state === 'ready');
    if (ready) {
      recording = ready;
      break;
    }
    const failed = list.find((r) => r.state === 'failed');
    if (failed) throw new Error(`the demo recording failed: ${failed.failureReason}`);
    if (Date.now() > deadline) throw new Error(`no ready recording after 6 minutes: ${JSON.stringify(list)}`);
    await new Promise((r) => setTimeout(r, 3000));
  }
  browser = await launchBrowser();
}, 420_000);

afterAll(async () => {
  await browser?.close();
});

const signInPage = (email: string, viewport: { width: number; height: number }) => signedInPage(browser, email, { viewport });

async function openEditor(page: Page, id = lessonId): Promise<void> {
  await page.goto(`${BASE()}/studio/classes/${id}`);
  await page.locator('[data-editor-ready="true"]').waitFor({ timeout: 60_000 });
}

const findingCodes = (page: Page) => page.locator('[data-finding]').evaluateAll((els) => els.map((e) => `${e.getAttribute('data-severity')} ${e.getAttribute('data-finding')}`));
const errorCount = (page: Page) => page.locator('[data-finding][data-severity="error"]').count();
const selectedTimes = (page: Page) => page.locator('[data-selected-times]').textContent();
const segmentRows = (page: Page) => page.locator('[data-segment-id]').evaluateAll((els) => els.map((e) => e.textContent));

describe('the timeline editor on Hill Sprints Prep', () => {
  it('lists the deliberate mistakes, fixes them by apply fix, drag, nudge and leaving the skipped station out of the plan, saves and reloads as saved', async () => {
    const { context, page } = await signInPage(DEMO.editor, { width: 1280, height: 800 });
    const pageErrors: string[] = [];
    page.on('pageerror', (e) => pageErrors.push(e.message));
    await openEditor(page);
    await page.getByRole('heading', { name: 'Timeline', level: 2 }).waitFor();
    // The recording is attached (hls.js or native) and the waveform is drawn from the stored peaks.
    await expect.poll(() => page.locator('video').evaluate((v: HTMLVideoElement) => v.readyState), { timeout: 30_000 }).toBeGreaterThanOrEqual(1);
    expect(Math.abs((await page.locator('video').evaluate((v: HTMLVideoElement) => v.duration)) - recording.durationSeconds!)).toBeLessThan(1);

    // The same findings as POST /api/lessons/{id}/check, listed by time.
    const server = (await (await api.post(`/api/lessons/${lessonId}/check`)).json()) as { findings: { code: string; severity: string }[] };
    expect(await findingCodes(page)).toEqual(server.findings.map((f) => `${f.severity} ${f.code}`));
    expect(await findingCodes(page)).toEqual(expect.arrayContaining(['error work-too-short', 'error overlap', 'error missing-station', 'warning length-vs-advertised']));
    await page.screenshot({ path: `${SHOTS}/editor-desktop-findings.png`, fullPage: true });

    // 1. The 9 s work interval: Apply fix makes it 40 s (and the gap after it goes too).
    await page.locator('[data-finding="work-too-short"]').getByRole('button', { name: /^Apply fix/ }).click();
    await expect.poll(() => findingCodes(page)).not.toContain('error work-too-short');
    expect(await findingCodes(page)).not.toContain('warning gap');

    // 2. The overlap: go to it (selects the early start), zoom in, drag the start edge right;
    // it snaps onto the planned boundary where the rest ends (10:55.0).
    await page.locator('[data-finding="overlap"]').getByRole('button', { name: /^Go to/ }).click();
    await expect.poll(() => selectedTimes(page)).toMatch(/^10:52\.5 – 11:35\.0/);
    for (let i = 0; i < 4; i++) await page.getByRole('button', { name: 'Zoom in' }).click(); // 20 px/s
    const region = page.locator('div[part~="region"][part~="s14"]');
    await region.scrollIntoViewIfNeeded();
    const handle = region.locator('[part~="region-handle-left"]');
    const box = (await handle.boundingBox())!;
    const x = box.x + box.width / 2;
    const y = box.y + box.height / 2;
    await page.mouse.move(x, y);
    await page.mouse.down();
    for (let i = 1; i <= 8; i++) await page.mouse.move(x + (2.7 * 20 * i) / 8, y);
    await page.mouse.up();
    await expect.poll(() => selectedTimes(page)).toMatch(/^10:55\.0 – 11:35\.0/);
    // The local draft (written a moment after each change) holds exactly 655.
    await expect.poll(async () => (await timelineOfPage(page)).find((x) => x.id === 's14')?.startSeconds).toBe(655);
    expect(await findingCodes(page)).not.toContain('error overlap');
    expect(await findingCodes(page)).not.toContain('error work-too-long');
    await page.screenshot({ path: `${SHOTS}/editor-desktop-dragged.png`, fullPage: true });

    // 3. Keyboard nudge of the selected boundary: 0.1 s and 1 s steps, then back to 10:55.0.
    await page.locator('[data-timeline]').focus();
    await page.keyboard.press('ArrowRight');
    await page.keyboard.press('Shift+ArrowRight');
    await expect.poll(() => selectedTimes(page)).toMatch(/^10:56\.1 – /);
    await page.keyboard.press('Shift+ArrowLeft');
    await page.keyboard.press('ArrowLeft');
    await expect.poll(() => selectedTimes(page)).toMatch(/^10:55\.0 – /);
    // Undo and redo walk the same steps.
    await page.keyboard.press('Control+z');
    await expect.poll(() => selectedTimes(page)).toMatch(/^10:55\.1 – /);
    await page.keyboard.press('Control+Shift+z');
    await expect.poll(() => selectedTimes(page)).toMatch(/^10:55\.0 – /);

    // 4. The missing station: the demo recording really skipped it (round 3, station 2), so the
    // finding's "Leave it out of this class" records that in the plan; the later marks already
    // follow the video, and the check passes.
    await page.getByRole('button', { name: 'Zoom out' }).click();
    const missing = page.locator('[data-finding="missing-station"]');
    expect(await missing.getByRole('button', { name: 'Mark it here' }).count()).toBe(1);
    await missing.getByRole('button', { name: 'Leave it out of this class' }).click();
    await page.locator('[data-plan-message]').filter({ hasText: 'out of round 3' }).waitFor();
    await expect.poll(() => findingCodes(page)).not.toContain('error missing-station');
    await expect.poll(() => errorCount(page)).toBe(0);
    await expect(page.locator('[data-check-summary]').textContent()).resolves.toMatch(/^0 errors/);
    const plan = (await (await api.get(`/api/lessons/${lessonId}/plan`)).json()) as { plan: { blocks: { roundChanges?: { round: number; skipStations?: number[] }[] }[] } };
    expect(plan.plan.blocks[1]!.roundChanges).toEqual([{ round: 3, skipStations: [2] }]);
    // The plan section on the same page follows the change.
    await expect.poll(() => page.locator('[data-round-change]').count()).toBe(1);
    await page.locator('[data-segment-list] summary').click();
    await page.locator('[data-segment-id]', { hasText: /^Warm-up/ }).click();
    await expect.poll(() => page.locator('[data-playhead]').textContent()).toMatch(/^0:15\.0/);
    // Kinds by keyboard: the segment under the playhead becomes talk (6), then warm-up again (4).
    await page.keyboard.press('6');
    await expect.poll(() => selectedTimes(page)).toMatch(/^0:15\.0 – 4:15\.0/);
    await expect(page.locator('[data-inspector="segment"] select').first().inputValue()).resolves.toBe('talk');
    await page.keyboard.press('4');
    await expect(page.locator('[data-inspector="segment"] select').first().inputValue()).resolves.toBe('warmup');
    await page.screenshot({ path: `${SHOTS}/editor-desktop-fixed.png`, fullPage: true });

    // 5. Save, reload: the timeline is as saved, and nothing is left unsaved.
    expect(await page.locator('[data-save-state]').getAttribute('data-dirty')).toBe('true');
    const before = await segmentRows(page);
    await page.getByRole('button', { name: 'Save timeline' }).click();
    await page.locator('[data-save-state="saved"][data-dirty="false"]').waitFor();
    const stored = await timelineOf(lessonId);
    expect(stored.segments).toHaveLength(before.length);
    await page.reload();
    await page.locator('[data-editor-ready="true"]').waitFor({ timeout: 60_000 });
    await page.locator('[data-segment-list] summary').click();
    expect(await segmentRows(page)).toEqual(before);
    expect(await errorCount(page)).toBe(0);
    expect(await page.locator('[data-save-state]').getAttribute('data-dirty')).toBe('false');
    const check = (await (await api.post(`/api/lessons/${lessonId}/check`)).json()) as { ok: boolean };
    expect(check.ok).toBe(true);
    expect(pageErrors).toEqual([]);
    await context.close();
  });

  it('looks right at tablet widths, and the keyboard help lists the keys', async () => {
    for (const [name, viewport] of [['tablet-portrait', { width: 820, height: 1180 }], ['tablet-landscape', { width: 1024, height: 768 }]] as const) {
      const { context, page } = await signInPage(DEMO.editor, viewport);
      await openEditor(page);
      await page.getByRole('button', { name: 'Keyboard help' }).click();
      await page.locator('[data-shortcut-help]').getByText('Split at the playhead').waitFor();
      // Touch-sized nudge buttons for the selected boundary.
      await page.locator('[data-timeline]').focus();
      await page.keyboard.press(']');
      await page.locator('[data-inspector="segment"]').waitFor();
      await page.screenshot({ path: `${SHOTS}/editor-${name}.png`, fullPage: true });
      const scrollWidth = await page.evaluate(() => document.documentElement.scrollWidth);
      expect(scrollWidth).toBeLessThanOrEqual(viewport.width); // nothing sticks out sideways
      await context.close();
    }
  });

  it('shows the 409 choice when someone else saved first, and keeps mine when asked', async () => {
    const first = await signInPage(DEMO.editor, { width: 1280, height: 800 });
    const second = await signInPage(DEMO.owner, { width: 1280, height: 800 });
    await openEditor(first.page);
    await openEditor(second.page);

    // Ada saves first: the first boundary after the start, 1 s later.
    await second.page.locator('[data-timeline]').focus();
    await second.page.keyboard.press(']');
    await second.page.keyboard.press('Shift+ArrowRight');
    await second.page.getByRole('button', { name: 'Save timeline' }).click();
    await second.page.locator('[data-save-state="saved"][data-dirty="false"]').waitFor();
    const theirs = await timelineOf(lessonId);

    // Priya, on the older version, adds a cue and saves: she is asked, not overwritten.
    await first.page.locator('[data-timeline]').focus();
    await first.page.keyboard.press('c');
    await first.page.locator('[data-inspector="cue"]').waitFor();
    await first.page.keyboard.press('Control+s');
    const dialog = first.page.locator('dialog[data-conflict]');
    await dialog.waitFor();
    await expect(dialog.getByRole('heading').textContent()).resolves.toBe('Someone else saved this timeline');
    // Her cue, and Ada's moved boundary (the intro's end and the warm-up's start).
    expect((await dialog.locator('[data-difference]').evaluateAll((els) => els.map((e) => e.getAttribute('data-difference')))).sort()).toEqual(['changed', 'changed', 'only-mine']);
    await first.page.screenshot({ path: `${SHOTS}/editor-conflict.png` });
    expect((await timelineOf(lessonId)).version).toBe(theirs.version); // nothing written yet

    await dialog.getByRole('button', { name: 'Keep mine and save' }).click();
    await dialog.waitFor({ state: 'hidden' });
    await first.page.locator('[data-save-state="saved"][data-dirty="false"]').waitFor();
    const after = await timelineOf(lessonId);
    expect(after.version).toBe(theirs.version + 1);
    expect(after.cues.length).toBe(theirs.cues.length + 1);

    // Ada is now behind; she takes Priya's marks instead of overwriting them.
    await second.page.keyboard.press('Shift+ArrowRight');
    await second.page.getByRole('button', { name: 'Save timeline' }).click();
    const dialog2 = second.page.locator('dialog[data-conflict]');
    await dialog2.waitFor();
    await dialog2.getByRole('button', { name: 'Take theirs' }).click();
    await second.page.locator('[data-save-state="saved"][data-dirty="false"]').waitFor();
    expect((await timelineOf(lessonId)).version).toBe(after.version);
    await first.context.close();
    await second.context.close();
  });

  it('ends published: the coach acknowledges the remaining warning and publishes from the class page', async () => {
    const { context, page } = await signInPage(DEMO.coach, { width: 1280, height: 800 });
    await openEditor(page);
    expect(await errorCount(page)).toBe(0);
    const panel = page.getByTestId('publish-panel');
    // Advertised 25 min for a class of about 19 min: a warning the coach acknowledges.
    await panel.getByLabel('I reviewed these warnings; publish anyway.').check();
    await panel.getByRole('button', { name: 'Publish now' }).click();
    await page.waitForURL(/published=/);
    await page.getByTestId('publish-panel').getByText(/Live in the library as version 1/).waitFor();
    const lesson = (await (await api.get(`/api/lessons/${lessonId}`)).json()) as { state: string };
    expect(lesson.state).toBe('published');
    await page.screenshot({ path: `${SHOTS}/editor-published.png`, fullPage: true });
    await context.close();
  });

  it('works without a ready recording: timeline over the class length and a plain note', async () => {
    const created = await api.post('/api/lessons', { title: 'Editor story: not recorded yet', advertisedMinutes: 20, mediaSeconds: 1200 });
    expect(created.status).toBe(201);
    const { id } = (await created.json()) as { id: string };
    const { context, page } = await signInPage(DEMO.editor, { width: 1280, height: 800 });
    await openEditor(page, id);
    await expect(page.locator('[data-no-recording]').textContent()).resolves.toContain('No recording is ready yet');
    await expect(page.locator('[data-playhead]').textContent()).resolves.toMatch(/\/ 20:00\.0$/);
    await page.locator('[data-timeline]').focus();
    await page.keyboard.press('s'); // a first segment from the playhead to the end
    await page.keyboard.press('1');
    await expect(page.locator('[data-segment-list] summary').textContent()).resolves.toContain('1 segment,');
    await page.screenshot({ path: `${SHOTS}/editor-no-recording.png`, fullPage: true });
    // Leaving with unsaved marks asks first; the marks wait on this device.
    await page.waitForTimeout(800); // the local draft is written a moment after a change
    let asked = '';
    page.once('dialog', (d) => {
      asked = d.type();
      void d.accept();
    });
    await page.reload();
    expect(asked).toBe('beforeunload');
    await page.locator('[data-editor-ready="true"]').waitFor();
    const offer = page.getByRole('region', { name: 'Unsaved draft' });
    await offer.getByRole('button', { name: 'Bring them back' }).click();
    await expect(page.locator('[data-segment-list] summary').textContent()).resolves.toContain('1 segment,');
    await context.close();
  });
});

describe('measured figures (printed, not timed assertions)', () => {
  it('frame rate while playing with 400 segments, and time to open a 90-minute recording', async () => {
    // 400 segments over the Hill Sprints recording.
    const duration = recording.durationSeconds!;
    const many = manySegments(400, duration);
    const current = await timelineOf(lessonId);
    expect((await api.put(`/api/lessons/${lessonId}/timeline`, { version: current.version, segments: many, cues: [] })).status).toBe(200);
    const { context, page } = await signInPage(DEMO.editor, { width: 1280, height: 800 });
    await openEditor(page);
    await page.getByRole('button', { name: 'Zoom in' }).click();
    await page.locator('[data-play]').click();
    await expect.poll(() => page.locator('video').evaluate((v: HTMLVideoElement) => !v.paused && v.currentTime > 0.3), { timeout: 20_000 }).toBe(true);
    const fps = await page.evaluate(
      () =>
        new Promise<{ frames: number; seconds: number; longFrames: number; worstMs: number }>((resolve) => {
          const t0 = performance.now();
          let last = t0;
          let frames = 0;
          let longFrames = 0;
          let worst = 0;
          const tick = (now: number) => {
            frames++;
            const d = now - last;
            if (d > 50) longFrames++;
            worst = Math.max(worst, d);
            last = now;
            if (now - t0 < 5000) requestAnimationFrame(tick);
            else resolve({ frames, seconds: (now - t0) / 1000, longFrames, worstMs: Math.round(worst) });
          };
          requestAnimationFrame(tick);
        }),
    );
    console.log(`[measure] playing with 400 segments: ${(fps.frames / fps.seconds).toFixed(1)} frames/s over ${fps.seconds.toFixed(1)} s; frames over 50 ms: ${fps.longFrames}; worst ${fps.worstMs} ms`);
    await context.close();

    // 90 minutes: a class with mediaSeconds 5400 and 400 segments; its recordings answer and peaks are
    // served by the page's router with synthetic 90-minute peaks (540,000 bins); no video, so the timeline
    // keeps the full 90 minutes (with the 19.5-minute demo video it would follow the video's length).
    const created = await api.post('/api/lessons', { title: 'Editor measure: ninety minutes', advertisedMinutes: 90, mediaSeconds: 5400 });
    const { id } = (await created.json()) as { id: string };
    expect((await api.put(`/api/lessons/${id}/timeline`, { version: 0, segments: manySegments(400, 5400), cues: [] })).status).toBe(200);
    const bins = 5400 * 100;
    const min = new Float32Array(bins);
    const max = new Float32Array(bins);
    for (let i = 0; i < bins; i++) {
      const v = 0.05 + 0.4 * Math.abs(Math.sin(i / 900)) * ((i % 1000) < 20 ? 2 : 1) * 0.5;
      max[i] = v;
      min[i] = -v;
    }
    const peaksFile = Buffer.from(encodePeaks({ rate: 100, min, max }));
    const m = await signInPage(DEMO.editor, { width: 1280, height: 800 });
    await m.page.route(`**/api/lessons/${id}/recordings`, (route) =>
      route.fulfill({ json: { recordings: [{ ...recording, lessonId: id, durationSeconds: 5400, playlistUrl: null, peaksUrl: '/measure/peaks-90min.bin' }] } }),
    );
    await m.page.route('**/measure/peaks-90min.bin', (route) => route.fulfill({ body: peaksFile, contentType: 'application/octet-stream' }));
    const times: number[] = [];
    for (let i = 0; i < 3; i++) {
      const t0 = Date.now();
      await openEditor(m.page, id);
      times.push(Date.now() - t0);
    }
    const navToReady = await m.page.evaluate(() => {
      const nav = performance.getEntriesByType('navigation')[0] as PerformanceNavigationTiming | undefined;
      return nav ? Math.round(performance.now() - nav.startTime) : -1;
    });
    console.log(`[measure] opening the editor on a 90-minute recording with 400 segments: ${times.join(' ms, ')} ms (page load to editor ready, 3 runs); last run in-page ${navToReady} ms`);
    await m.page.screenshot({ path: `${SHOTS}/editor-90-minutes.png`, fullPage: true });
    await m.context.close();
  });
});

function manySegments(count: number, duration: number) {
  const kinds = ['work', 'rest'] as const;
  const step = Math.floor((duration / count) * 1000) / 1000;
  return Array.from({ length: count }, (_, i) => ({
    id: `g${i + 1}`,
    kind: kinds[i % 2]!,
    startSeconds: Math.round(i * step * 1000) / 1000,
    endSeconds: Math.round((i + 1) * step * 1000) / 1000,
    ...(i % 2 === 0 ? { exercise: 'Squat jump' } : {}),
  }));
}

/** The timeline as the page holds it, read from its segment list (no private hooks). */
async function timelineOfPage(page: Page): Promise<{ id: string; startSeconds: number }[]> {
  const stored = await page.evaluate(() => {
    const key = Object.keys(localStorage).find((k) => k.startsWith('roundmark:timeline-draft:'));
    return key ? localStorage.getItem(key) : null;
  });
  if (stored) return (JSON.parse(stored) as { timeline: { segments: { id: string; startSeconds: number }[] } }).timeline.segments;
  return [];
}
