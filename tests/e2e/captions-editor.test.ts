/**
 * The staff captions editor on the class page, through the real controls in Chromium: Priya
 * (editor) uploads a WebVTT file and then an SRT file through the file field, sees the captions
 * listed, edits one's text and times, removes one, and a broken file is refused at the file field
 * with nothing stored; the coach publishes from the panel and members get exactly the saved
 * captions; "Remove all captions" asks first. The caption files are invented for this test and
 * written here (SRT in SubRip's usual layout: common practice, no formal spec).
 */
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { WebVTTParser } from 'webvtt-parser';
import { type ApiClient, BASE, DEMO, signedIn } from '../helpers/api-client';
import { launchBrowser, SHOTS } from '../helpers/browser';
import { createSmallClass } from '../helpers/published-class';
import { signedInPage } from '../helpers/role-pages';

interface StoredCaptions { version: number; language: string; label: string; cues: { startSeconds: number; endSeconds: number; text: string }[] }

let browser: Browser;
let dir: string;
let coach: ApiClient;
let cls: { lessonId: string; slug: string };

// Invented caption files for the 12 s test class.
const VTT = 'WEBVTT\n\n00:00.500 --> 00:03.000\n<v Tomasz>Step up, drive through the heel.</v>\n\n00:04.000 --> 00:05.500\n[timer beeps]\n\n00:06.000 --> 00:11.000\nLast set &amp; keep it steady.\n';
const SRT = '1\r\n00:00:01,000 --> 00:00:03,500\r\nStand tall on the step.\r\n\r\n2\r\n00:00:04,000 --> 00:00:06,000\r\nRest.\r\n\r\n3\r\n00:00:06,000 --> 00:00:10,000\r\nSecond set,\r\nsame pace.\r\n\r\n4\r\n00:00:10,000 --> 00:00:11,500\r\n[timer beeps]\r\n';
// Cue 2's timing line has its arrow missing: the parser takes line 6 for a cue identifier and
// refuses the next line, which is no timing line (W3C WebVTT §4.1 cue timings).
const BROKEN = 'WEBVTT\n\n00:01.000 --> 00:02.000\nFine.\n\n00:03.000 00:04.000\nNo arrow.\n';

const stored = async () => (await (await coach.get(`/api/lessons/${cls.lessonId}/captions`)).json()) as StoredCaptions;

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'roundmark-captions-editor-'));
  coach = await signedIn(DEMO.coach);
  cls = await createSmallClass(coach, dir, `Captions editor ${Date.now()}`); // a 12 s generated recording
  await writeFile(join(dir, 'step-up.vtt'), VTT);
  await writeFile(join(dir, 'step-up.srt'), SRT);
  await writeFile(join(dir, 'broken.vtt'), BROKEN);
  browser = await launchBrowser();
}, 300_000);
afterAll(async () => {
  await browser?.close();
  await rm(dir, { recursive: true, force: true });
});

async function openCaptions(page: Page) {
  await page.goto(`${BASE()}/studio/classes/${cls.lessonId}`);
  const section = page.locator('[data-captions-section]');
  await section.locator('[data-captions-editor]').waitFor();
  return section;
}

/** What the list shows: each caption's start, end and text fields. */
const listed = (page: Page) =>
  page.locator('[data-caption]').evaluateAll((rows) =>
    rows.map((r) => Array.from(r.querySelectorAll('input, textarea')).map((f) => (f as HTMLInputElement).value)),
  );

describe('the captions editor', () => {
  it('uploads WebVTT and SRT files, edits and removes captions, refuses a broken file, and publishes what was saved', async () => {
    const { context, page } = await signedInPage(browser, DEMO.editor, { viewport: { width: 1366, height: 900 } });
    const section = await openCaptions(page);
    expect(await section.getByText('No captions yet.').count()).toBe(1);
    const file = section.getByLabel('Caption file (.vtt or .srt)');

    await file.setInputFiles(join(dir, 'step-up.vtt'));
    await section.getByRole('status').filter({ hasText: 'step-up.vtt: 3 captions saved.' }).waitFor();
    // Tags dropped and entities read: captions are stored as plain text.
    expect(await listed(page)).toEqual([
      ['0:00.500', '0:03.000', 'Step up, drive through the heel.'],
      ['0:04.000', '0:05.500', '[timer beeps]'],
      ['0:06.000', '0:11.000', 'Last set & keep it steady.'],
    ]);

    // A second file replaces the captions.
    await file.setInputFiles(join(dir, 'step-up.srt'));
    await section.getByRole('status').filter({ hasText: 'step-up.srt: 4 captions saved.' }).waitFor();
    expect(await listed(page)).toEqual([
      ['0:01.000', '0:03.500', 'Stand tall on the step.'],
      ['0:04.000', '0:06.000', 'Rest.'],
      ['0:06.000', '0:10.000', 'Second set,\nsame pace.'],
      ['0:10.000', '0:11.500', '[timer beeps]'],
    ]);

    // Edit caption 2's times and text, save, and read it back after a reload.
    await section.getByLabel('Caption 2 start').fill('0:04.250');
    await section.getByLabel('Caption 2 end').fill('5.75');
    await section.getByLabel('Caption 2 text').fill('Rest, shake the legs out.');
    await section.getByRole('button', { name: 'Save captions' }).click();
    await section.getByRole('status').filter({ hasText: 'Captions saved.' }).waitFor();
    await openCaptions(page);
    expect((await listed(page))[1]).toEqual(['0:04.250', '0:05.750', 'Rest, shake the legs out.']);

    // A time that is not a time is refused at its field, and nothing is sent.
    const before = await stored();
    await section.getByLabel('Caption 1 end').fill('three');
    await section.getByRole('button', { name: 'Save captions' }).click();
    await section.getByText('"three" is not a time.').first().waitFor();
    expect(await section.getByLabel('Caption 1 end').getAttribute('aria-invalid')).toBe('true');
    expect(await stored()).toEqual(before);
    await openCaptions(page);

    // Remove caption 4.
    await section.getByRole('button', { name: 'Remove caption 4' }).click();
    await section.getByRole('status').filter({ hasText: 'Caption 4 removed.' }).waitFor();
    expect((await listed(page)).map((r) => r[2])).toEqual(['Stand tall on the step.', 'Rest, shake the legs out.', 'Second set,\nsame pace.']);

    // A broken file: its message at the file field, the stored captions untouched.
    const kept = await stored();
    expect(kept.cues).toHaveLength(3);
    await file.setInputFiles(join(dir, 'broken.vtt'));
    const problem = section.locator('[data-file-error]');
    await problem.waitFor();
    expect(await problem.textContent()).toMatch(/^broken\.vtt: The WebVTT file has a problem on line 7: Cue identifier needs to be followed by timestamp/);
    expect(await file.getAttribute('aria-describedby')).toBe(await problem.getAttribute('id'));
    expect(await stored()).toEqual(kept);
    expect(await listed(page)).toHaveLength(3);
    await page.screenshot({ path: `${SHOTS}/captions-editor.png`, fullPage: true });
    await context.close();

    // The coach publishes from the panel; members get exactly the saved captions.
    const coachPage = await signedInPage(browser, DEMO.coach, { viewport: { width: 1366, height: 900 } });
    await coachPage.page.goto(`${BASE()}/studio/classes/${cls.lessonId}`);
    const panel = coachPage.page.getByTestId('publish-panel');
    await panel.getByLabel('I reviewed these warnings; publish anyway.').check();
    await panel.getByRole('button', { name: 'Publish now' }).click();
    await panel.getByRole('status').filter({ hasText: 'Published as version 1.' }).waitFor();
    await coachPage.context.close();
    const member = await signedIn(DEMO.member);
    const res = await member.get(`/s/fernhill/classes/${cls.slug}/captions.vtt`);
    expect(res.status).toBe(200);
    // webvtt-parser 2.2.0 follows the W3C WebVTT parsing algorithm (https://www.w3.org/TR/webvtt1/).
    const published = new WebVTTParser().parse(await res.text());
    expect(published.errors).toEqual([]);
    expect(published.cues.map((c) => [c.startTime, c.endTime, c.text])).toEqual([
      [1, 3.5, 'Stand tall on the step.'],
      [4.25, 5.75, 'Rest, shake the legs out.'],
      [6, 10, 'Second set,\nsame pace.'],
    ]);
  }, 240_000);

  it('removes all captions only after the confirm step', async () => {
    const { context, page } = await signedInPage(browser, DEMO.editor, { viewport: { width: 1366, height: 900 } });
    const section = await openCaptions(page);
    const before = await stored();
    expect(before.cues.length).toBeGreaterThan(0);
    await section.getByRole('button', { name: 'Remove all captions' }).click();
    await section.getByText(`Remove all ${before.cues.length} captions?`).waitFor();
    await section.getByRole('button', { name: 'Keep them' }).click();
    expect(await section.getByRole('button', { name: 'Yes, remove all' }).count()).toBe(0);
    expect(await stored()).toEqual(before);

    await section.getByRole('button', { name: 'Remove all captions' }).click();
    await section.getByRole('button', { name: 'Yes, remove all' }).click();
    await section.getByRole('status').filter({ hasText: 'All captions removed.' }).waitFor();
    expect(await section.getByText('No captions yet.').count()).toBe(1);
    expect((await stored()).cues).toEqual([]);
    // The published version keeps its captions until the class is published again.
    expect((await (await signedIn(DEMO.member)).get(`/s/fernhill/classes/${cls.slug}/captions.vtt`)).status).toBe(200);
    await context.close();
  }, 120_000);
});
