// "Use this frame as cover" in the browser, through the class page's own controls: the editor
// clicks the timeline to move the playhead, presses the button, sees the progress and then the new
// cover; the stored picture is the frame on screen. The clip is an invented test input with known
// colours per time (red 0–4 s, blue 4–8 s, green 8–12 s). When the recording's file is gone, the
// page says so. Screenshot: test-results/screenshots/cover-frame.png.
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import type { Browser, Page } from 'playwright-core';
import { DeleteObjectCommand } from '@aws-sdk/client-s3';
import { BASE, DEMO, signedIn, type ApiClient } from '../helpers/api-client';
import { launchBrowser, SHOTS } from '../helpers/browser';
import { colourAt, makeColourClip, pictureFacts } from '../helpers/media-files';
import { fetchMedia } from '../helpers/media-fetch';
import { signedInPage } from '../helpers/role-pages';
import { uploadWhole, waitForRecording } from '../helpers/upload-flow';
import { createAppDeps } from '~/server/app';
import { testBucket, testS3 } from '../helpers/object-store';
import { recordings } from '~/db/schema';
import { formatEditorTime } from '~/lib/time/format-time';

let browser: Browser;
let dir: string;
let coach: ApiClient;
let lessonId = '';
let recordingId = '';
const deps = createAppDeps(process.env.DATABASE_URL!);

beforeAll(async () => {
  browser = await launchBrowser();
  dir = await mkdtemp(join(tmpdir(), 'roundmark-cover-frame-e2e-'));
  coach = await signedIn(DEMO.coach);
  // The class and its ready recording are the starting point (the upload control has its own story).
  const lesson = await (await coach.post('/api/lessons', { title: `Frame cover page ${Date.now().toString(36)}`, advertisedMinutes: 1 })).json();
  lessonId = lesson.id;
  const clip = join(dir, 'colours.mp4');
  await makeColourClip(clip);
  ({ recordingId } = await uploadWhole(coach, lessonId, 'colours.mp4', new Uint8Array(await readFile(clip))));
  expect((await waitForRecording(coach, recordingId)).state).toBe('ready');
}, 240_000);
afterAll(async () => {
  await browser?.close();
  await rm(dir, { recursive: true, force: true });
  await deps.pool.end();
});

/** Clicks the timeline at a fraction of its width (moves the playhead there) and answers the video's time. */
async function clickTimelineAt(page: Page, fraction: number): Promise<number> {
  await page.locator('[data-waveform]').scrollIntoViewIfNeeded();
  const box = (await page.locator('[data-waveform]').boundingBox())!;
  await page.mouse.click(box.x + box.width * fraction, box.y + box.height / 2);
  // The video fetches the segment it seeks into: wait for the frame to be there (a state, not a sleep).
  await expect.poll(() => page.locator('[data-editor-video]').evaluate((v: HTMLVideoElement) => !v.seeking && v.readyState >= 2 && v.currentTime > 0), { timeout: 30_000 }).toBe(true);
  return page.locator('[data-editor-video]').evaluate((v: HTMLVideoElement) => v.currentTime);
}

describe('cover from the frame at the playhead', () => {
  it('the editor pauses on a frame and makes it the cover; the stored picture is that frame', async () => {
    const { context, page } = await signedInPage(browser, DEMO.editor, { viewport: { width: 1366, height: 900 } });
    await page.goto(`${BASE()}/studio/classes/${lessonId}`);
    await page.locator('[data-editor-ready="true"]').waitFor({ timeout: 60_000 });
    await expect.poll(() => page.locator('[data-editor-video]').evaluate((v: HTMLVideoElement) => v.readyState), { timeout: 30_000 }).toBeGreaterThanOrEqual(1);

    const picker = page.locator('[data-cover-picker]');
    for (const fraction of [0.5, 0.8]) {
      const at = await clickTimelineAt(page, fraction);
      const expected = colourAt(at);
      await picker.getByRole('button', { name: 'Use this frame as cover' }).click();
      // The page names the moment it took, so this waits for this picture and not the one before.
      await picker.getByRole('status').filter({ hasText: `The frame at ${formatEditorTime(Math.round(at * 1000) / 1000)} is the cover now.` }).waitFor({ timeout: 90_000 });
      const url = await picker.locator('[data-current-cover]').getAttribute('data-current-cover');
      expect(url).toMatch(new RegExp(`^/media/${recordingId}/cover/[0-9a-f-]{36}\\.jpg$`));
      await picker.locator('img[data-current-cover]').evaluate((img: HTMLImageElement) => img.decode()); // the picture really loads
      const file = join(dir, `cover-${fraction}.jpg`);
      await writeFile(file, new Uint8Array(await (await fetchMedia(coach, url!)).arrayBuffer()));
      const facts = await pictureFacts(file);
      expect(facts.size).toBe('mjpeg,1280,720');
      // The frame on screen at that time (the clip's known colours); JPEG moves pure colours by a few steps (common practice, no source).
      facts.rgb.forEach((v, i) => expect(Math.abs(v - expected.rgb[i]!), `${expected.name} at ${at} s`).toBeLessThanOrEqual(24));
    }
    await page.locator('section[aria-labelledby="cover-title"]').scrollIntoViewIfNeeded();
    await page.screenshot({ path: `${SHOTS}/cover-frame.png` });

    // The recording's file disappears from storage: the page says what happened and what to do.
    const [rec] = await deps.db.select().from(recordings).where(eq(recordings.id, recordingId));
    await testS3().send(new DeleteObjectCommand({ Bucket: testBucket(), Key: rec!.sourceKey }));
    const before = await picker.locator('[data-current-cover]').getAttribute('data-current-cover');
    await clickTimelineAt(page, 0.2);
    await picker.getByRole('button', { name: 'Use this frame as cover' }).click();
    await picker.getByRole('alert').filter({ hasText: 'The recording’s file is no longer in storage. Upload the recording again, or upload a picture.' }).waitFor({ timeout: 90_000 });
    expect(await picker.locator('[data-current-cover]').getAttribute('data-current-cover')).toBe(before);
    await context.close();
  }, 300_000);
});
