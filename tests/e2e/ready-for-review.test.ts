// The editor's hand-off through the real controls: the editor marks a class ready for review with a
// note on its class page; the coach and the owner get an e-mail (through the mail job and the local
// mail fake); the coach sees it in the review list on the studio home, follows it to the class, reads
// who prepared it and the note in the publishing panel, and publishes, which ends the wait. A second
// class is sent back with a note from the panel, and the editor hears why. Classes and notes are
// invented for the test; they are created through the API (set-up, not the thing under test).
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { type ApiClient, DEMO, signedIn } from '../helpers/api-client';
import { launchBrowser, SHOTS } from '../helpers/browser';
import { waitForMessage } from '../helpers/mail-box';
import { createSmallClass } from '../helpers/published-class';
import { signedInContext } from '../helpers/role-pages';

let browser: Browser;
let coachApi: ApiClient;
let dir = '';
const suffix = Date.now().toString(36);
const created: string[] = [];

beforeAll(async () => {
  browser = await launchBrowser();
  coachApi = await signedIn(DEMO.coach);
  dir = await mkdtemp(join(tmpdir(), 'roundmark-review-e2e-'));
});
afterAll(async () => {
  await browser?.close();
  for (const id of created) await coachApi.del(`/api/lessons/${id}`);
  await rm(dir, { recursive: true, force: true });
});

/** From wherever the person is, to the class page through the Classes list. */
async function openClass(page: Page, title: string) {
  await page.getByRole('link', { name: 'Classes' }).first().click();
  await page.getByRole('link', { name: title, exact: true }).click();
  await page.getByTestId('publish-panel').locator('[data-review-hand-off]').waitFor();
}

/** The editor hands the class off with a note through the publishing panel's own control. */
async function handOff(title: string, note: string) {
  const editor = await signedInContext(browser, 'editor', { width: 1366, height: 900 });
  await openClass(editor.page, title);
  const panel = editor.page.getByTestId('publish-panel');
  await panel.getByLabel('Note for the coach (optional)').fill(note);
  await panel.getByRole('button', { name: 'Mark ready for review' }).click();
  await panel.getByRole('status').filter({ hasText: 'Marked ready for review. Coaches and the owner have been told.' }).waitFor();
  expect(await panel.locator('[data-review-request]').textContent()).toContain('Prepared by Priya Sandoval');
  return editor;
}

describe('ready for review', () => {
  it('the editor hands a class off; the coach finds it on the studio home, reads the note and publishes', async () => {
    const title = `Review story ${suffix}`;
    const note = 'Marked both sets; the last rest is short because the recording ends early.';
    const { lessonId } = await createSmallClass(coachApi, dir, title);
    created.push(lessonId);
    const since = new Date();

    const editor = await handOff(title, note);
    await editor.page.locator('[data-review-request]').scrollIntoViewIfNeeded();
    await editor.page.screenshot({ path: `${SHOTS}/ready-for-review-editor.png` });
    await editor.context.close();

    for (const to of [DEMO.coach, DEMO.owner]) {
      const mail = await waitForMessage(to, { since, timeoutMs: 60_000, match: (e) => !!e.subject?.includes(title) });
      expect(mail.parsed.subject).toBe(`Priya Sandoval marked “${title}” ready for review`);
      expect(mail.parsed.text).toContain(`Their note: “${note}”`);
    }

    const coach = await signedInContext(browser, 'coach', { width: 1366, height: 900 });
    await coach.page.getByRole('link', { name: 'Roundmark' }).first().click();
    const list = coach.page.locator('section[aria-labelledby="reviews-title"]');
    const item = list.locator(`[data-review-item="${lessonId}"]`);
    await item.waitFor();
    expect(await item.textContent()).toContain('prepared by Priya Sandoval');
    expect(await item.textContent()).toContain(note);
    await list.screenshot({ path: `${SHOTS}/ready-for-review-home.png` });

    await item.getByRole('link', { name: title }).click();
    const panel = coach.page.getByTestId('publish-panel');
    const request = panel.locator('[data-review-request]');
    await request.waitFor();
    expect(await request.textContent()).toContain('Prepared by Priya Sandoval');
    expect(await request.textContent()).toContain(note);
    // Advertised 1 min for a 12 s class: a warning the coach acknowledges.
    await panel.getByLabel('I reviewed these warnings; publish anyway.').check();
    await panel.getByRole('button', { name: 'Publish now' }).click();
    await coach.page.getByTestId('publish-panel').getByText(/Live in the library as version 1/).waitFor();
    await coach.page.getByTestId('publish-panel').locator('[data-review-none]').waitFor();

    await coach.page.getByRole('link', { name: 'Roundmark' }).first().click();
    await coach.page.locator('section[aria-labelledby="reviews-title"]').waitFor();
    expect(await coach.page.locator(`[data-review-item="${lessonId}"]`).count()).toBe(0);
    await coach.context.close();
  }, 240_000);

  it('the coach sends a class back with a note from the panel; the editor is told why', async () => {
    const title = `Review sent back ${suffix}`;
    const created1 = await (await coachApi.post('/api/lessons', { title, advertisedMinutes: 20 })).json();
    created.push(created1.id);
    (await handOff(title, 'Ready, I think.')).context.close();

    const coach = await signedInContext(browser, 'coach', { width: 1366, height: 900 });
    await openClass(coach.page, title);
    const panel = coach.page.getByTestId('publish-panel');
    await panel.getByRole('button', { name: 'Send back with this note' }).click();
    await panel.getByRole('alert').filter({ hasText: 'Say what needs another look' }).waitFor();
    expect(await panel.getByLabel('What needs another look').getAttribute('aria-invalid')).toBe('true');

    const since = new Date();
    await panel.getByLabel('What needs another look').fill('Round 2 has no cues yet.');
    await panel.getByRole('button', { name: 'Send back with this note' }).click();
    await panel.getByRole('status').filter({ hasText: 'Sent back to Priya Sandoval with your note.' }).waitFor();
    await panel.locator('[data-review-none]').waitFor();
    const mail = await waitForMessage(DEMO.editor, { since, timeoutMs: 60_000, match: (e) => !!e.subject?.includes(title) });
    expect(mail.parsed.text).toContain('What needs another look: “Round 2 has no cues yet.”');
    await coach.context.close();
  }, 120_000);
});
