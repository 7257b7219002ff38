// The studio's class forms through real Chromium and the real app: create a class (an error shown
// at its field first), save its details, and publish it from the publishing panel after
// acknowledging the check's warnings. The forms post to Astro Actions without any JavaScript of
// ours, so they work as plain HTML forms. Screenshots go to test-results/screenshots/class-forms-*.png.
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { BASE, DEMO, signedIn } from '../helpers/api-client';
import { launchBrowser, SHOTS } from '../helpers/browser';
import { createSmallClass } from '../helpers/published-class';
import { signedInPage } from '../helpers/role-pages';

let browser: Browser;
let dir: string;

beforeAll(async () => {
  browser = await launchBrowser();
  dir = await mkdtemp(join(tmpdir(), 'roundmark-class-forms-'));
});
afterAll(async () => {
  await browser?.close();
  await rm(dir, { recursive: true, force: true });
});

async function signInAs(email: string): Promise<Page> {
  // JavaScript off: the forms must work as plain HTML (progressive enhancement).
  return (await signedInPage(browser, email, { javaScriptEnabled: false })).page;
}

describe('team form', () => {
  it('the owner invites a coach by the form (a bad address shown at its field first), then withdraws the invitation', async () => {
    const page = await signInAs(DEMO.owner);
    await page.goto(BASE() + '/studio/team');
    const form = page.locator('section[aria-labelledby="invite-title"] form');
    await form.getByLabel('E-mail').fill('not-an-address');
    await form.getByRole('button', { name: 'Send invitation' }).click();
    const error = page.locator('[data-field-error="email"]');
    await error.waitFor();
    expect(await error.textContent()).toBe('Enter an e-mail address like name@example.com.');

    const email = `form-invite-${Date.now()}@members.example`;
    await form.getByLabel('E-mail').fill(email);
    await form.getByRole('button', { name: 'Send invitation' }).click();
    await page.getByRole('status').filter({ hasText: `Invitation sent to ${email}.` }).waitFor();
    const row = page.locator(`tr[data-invitation="${email}"]`);
    expect(await row.count()).toBe(1);

    await row.getByRole('button', { name: `Withdraw the invitation to ${email}` }).click();
    await page.getByRole('status').filter({ hasText: 'Invitation withdrawn.' }).waitFor();
    expect(await page.locator(`tr[data-invitation="${email}"]`).count()).toBe(0);
    await page.context().close();
  });
});

describe('class forms', () => {
  it('creates a class, showing a missing title at its field first, then saves its details', async () => {
    const page = await signInAs(DEMO.coach);
    await page.goto(BASE() + '/studio/classes');
    const form = page.locator('#new-class form');
    await form.getByLabel('Advertised length (minutes)').fill('25');
    await form.getByRole('button', { name: 'Create class' }).click();
    const titleError = page.locator('[data-field-error="title"]');
    await titleError.waitFor();
    expect(await titleError.textContent()).toBe('Give the class a title.');
    // What was typed stays in the form.
    expect(await form.getByLabel('Advertised length (minutes)').inputValue()).toBe('25');

    const title = `Form-made class ${Date.now()}`;
    await form.getByLabel('Title').fill(title);
    await form.getByRole('button', { name: 'Create class' }).click();
    await page.waitForURL(/\/studio\/classes\/[0-9a-f-]{36}$/);
    expect(await page.getByRole('heading', { level: 1 }).textContent()).toBe(title);

    const details = page.locator('section[aria-labelledby="details-title"] form');
    await details.getByLabel('Equipment').fill('mat, dumbbells');
    await details.getByRole('button', { name: 'Save details' }).click();
    await page.getByRole('status').filter({ hasText: 'Saved.' }).waitFor();
    expect(await page.locator('section[aria-labelledby="details-title"]').getByLabel('Equipment').inputValue()).toBe('mat, dumbbells');

    await details.getByLabel('Advertised length (minutes)').fill('0');
    await details.getByRole('button', { name: 'Save details' }).click();
    const minutesError = page.locator('[data-field-error="advertisedMinutes"]');
    await minutesError.waitFor();
    expect(await minutesError.textContent()).toBe('A class lasts at least 1 minute.');
    await page.screenshot({ path: `${SHOTS}/class-forms-details-error.png`, fullPage: true });
    await page.context().close();
  });

  it('publishes from the panel once the warnings are acknowledged; an editor sees no publish button', async () => {
    const cls = await createSmallClass(await signedIn(DEMO.coach), dir, `Panel publish ${Date.now()}`);
    const editor = await signInAs(DEMO.editor);
    await editor.goto(`${BASE()}/studio/classes/${cls.lessonId}`);
    await editor.getByTestId('publish-panel').waitFor();
    expect(await editor.getByRole('button', { name: 'Publish now' }).count()).toBe(0);
    await editor.context().close();

    const page = await signInAs(DEMO.coach);
    await page.goto(`${BASE()}/studio/classes/${cls.lessonId}`);
    const panel = page.getByTestId('publish-panel');
    // The small class is advertised at 1 minute but lasts 12 s: the check warns, and the
    // acknowledgement is required before "Publish now" sends (the server refuses without it too:
    // tests/integration/publishing.test.ts).
    expect(await panel.getByText(/The timing check has \d+ warnings?/).count()).toBe(1);
    await panel.getByLabel('I reviewed these warnings; publish anyway.').check();
    await panel.getByRole('button', { name: 'Publish now' }).click();
    await panel.getByRole('status').filter({ hasText: 'Published as version 1.' }).waitFor();
    expect(await panel.textContent()).toContain('Live in the library as version 1');
    await page.screenshot({ path: `${SHOTS}/class-forms-published.png`, fullPage: true });
    await page.context().close();
  });
});
