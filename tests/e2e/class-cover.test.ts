// Choosing a cover in the browser, through the class page's own controls: the published demo class
// Desk-Break Mobility starts with its first WORK chapter's picture (not a rest frame), the coach picks
// another chapter's picture, then uploads a PNG (an invented test picture made with ffmpeg), sees it on
// the library card, and goes back to the default. Screenshot: test-results/screenshots/class-cover.png.
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { DEMO, signedIn } from '../helpers/api-client';
import { launchBrowser, SHOTS } from '../helpers/browser';
import { ensureDeskBreakPublished } from '../helpers/demo-class';
import { ffmpeg } from '../helpers/media-files';
import { signedInContext } from '../helpers/role-pages';

let browser: Browser;
let dir: string;

beforeAll(async () => {
  browser = await launchBrowser();
  dir = await mkdtemp(join(tmpdir(), 'roundmark-cover-e2e-'));
});
afterAll(async () => {
  await browser?.close();
  await rm(dir, { recursive: true, force: true });
});

describe('choosing a cover', () => {
  it('the coach picks a chapter picture, then uploads a photo; the library card shows it', async () => {
    const desk = await ensureDeskBreakPublished();
    const coach = await signedIn(DEMO.coach);
    // The worker makes the chapter pictures after publishing, then sets the default cover: wait for that state.
    const deadline = Date.now() + 180_000;
    let cover = await (await coach.get(`/api/lessons/${desk.id}/cover`)).json();
    while (!cover.coverUrl && Date.now() < deadline) {
      await new Promise((r) => setTimeout(r, 500)); // polling interval for a state
      cover = await (await coach.get(`/api/lessons/${desk.id}/cover`)).json();
    }
    const firstWork = cover.chapters.find((c: { kind: string }) => c.kind === 'work');
    expect(cover.coverUrl).toBe(firstWork.thumbnailUrl);

    const { context, page } = await signedInContext(browser, 'coach', { width: 1366, height: 900 });
    await page.getByRole('link', { name: 'Classes' }).first().click();
    await page.getByRole('link', { name: 'Desk-Break Mobility' }).first().click();
    const picker = page.locator('[data-cover-picker]');
    await picker.waitFor();
    const other = cover.chapters.find((c: { number: number }) => c.number !== firstWork.number);
    await picker.getByRole('button', { name: new RegExp(`^${other.number}\\. `) }).click();
    await page.getByRole('status').filter({ hasText: `Chapter ${other.number} is the cover now.` }).waitFor();
    expect(await picker.locator('[data-current-cover]').getAttribute('data-current-cover')).toBe(other.thumbnailUrl);

    const photo = join(dir, 'cover-photo.png');
    await ffmpeg('-f', 'lavfi', '-i', 'testsrc2=size=960x540:rate=1', '-frames:v', '1', photo);
    await picker.getByLabel('Upload a picture (JPEG or PNG, at most 5 MB)').setInputFiles(photo);
    await page.getByRole('status').filter({ hasText: 'Picture uploaded: it is the cover now.' }).waitFor();
    const uploaded = await picker.locator('[data-current-cover]').getAttribute('data-current-cover');
    expect(uploaded).toMatch(/^\/media\/[0-9a-f-]{36}\/cover\/[0-9a-f-]{36}\.jpg$/);
    await page.locator('section[aria-labelledby="cover-title"]').scrollIntoViewIfNeeded();
    await page.screenshot({ path: `${SHOTS}/class-cover.png` });

    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Library' }).first().click();
    const card = page.locator(`[data-class-card="${desk.slug}"]`);
    await card.waitFor();
    expect(await card.locator('img[data-cover]').getAttribute('src')).toBe(uploaded);
    await card.locator('img[data-cover]').evaluate((img: HTMLImageElement) => img.decode()); // the picture really loads
    await card.screenshot({ path: `${SHOTS}/class-cover-card.png` });

    // Back to the default, so the demo class is as the seed left it.
    await page.goBack();
    await page.locator('[data-cover-picker]').getByRole('button', { name: 'Use the first work chapter' }).click();
    await page.getByRole('status').filter({ hasText: 'Back to the first work chapter’s picture.' }).waitFor();
    expect((await (await coach.get(`/api/lessons/${desk.id}/cover`)).json()).coverUrl).toBe(firstWork.thumbnailUrl);
    await context.close();
  }, 300_000);
});
