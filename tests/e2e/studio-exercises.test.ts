// The studio's Exercises page through real Chromium and the real app, only through its controls:
// an editor adds two names (an empty one refused at its field first), searches, edits cautions and
// the easier/harder options, then merges one name into the other after a confirmation step that
// names the class using it; that class's plan follows. Names below are invented for this test.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { DEMO, signedIn } from '../helpers/api-client';
import { launchBrowser, SHOTS } from '../helpers/browser';
import { signedInContext } from '../helpers/role-pages';

let browser: Browser;
const suffix = Date.now().toString(36);
const merged = `Page jumping jack ${suffix}`;
const kept = `Page star jump ${suffix}`;

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe('studio Exercises page', () => {
  it('an editor adds, searches, edits cautions and options, and merges two names after confirming', async () => {
    // A class whose plan names the move about to be merged away.
    const coach = await signedIn(DEMO.coach);
    const lesson = await (await coach.post('/api/lessons', { title: `Exercises page class ${suffix}`, advertisedMinutes: 5 })).json();
    const put = await coach.put(`/api/lessons/${lesson.id}/plan`, { version: lesson.version, blocks: [{ kind: 'intervals', exercise: merged, sets: 2, workSeconds: 20, restSeconds: 10 }] });
    expect(put.status).toBe(200); // also adds the name to the studio's list

    const { context, page } = await signedInContext(browser, 'editor', { width: 1366, height: 900 });
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Exercises' }).first().click();
    await page.waitForURL((u) => u.pathname === '/studio/exercises');
    // Astro drops the island's ssr attribute once React has hydrated it: only then do buttons work.
    await page.waitForSelector('astro-island:not([ssr])');

    const add = page.locator('form', { has: page.getByRole('button', { name: 'Add exercise' }) });
    await add.getByRole('button', { name: 'Add exercise' }).click();
    await add.locator('[data-field-error]').waitFor();
    expect(await add.locator('[data-field-error]').textContent()).toBe('The exercise needs a name.');
    await add.getByLabel('Name').fill(kept);
    await add.getByRole('button', { name: 'Add exercise' }).click();
    await page.getByRole('status').filter({ hasText: `Added “${kept}”.` }).waitFor();

    await page.getByLabel('Search').fill(suffix);
    await page.getByText('2 of', { exact: false }).waitFor();
    expect(await page.locator('[data-exercise]').evaluateAll((els) => els.map((e) => e.getAttribute('data-exercise')))).toEqual([merged, kept]);

    await page.getByRole('button', { name: `Edit ${kept}` }).click();
    const form = page.getByRole('form', { name: `Edit ${kept}` });
    await form.getByLabel('Cautions').fill('Land softly; march on the spot if jumping hurts.');
    await form.getByLabel('Easier option').fill('Step out instead of jumping');
    await form.getByLabel('Harder option').fill('Add a squat between jumps');
    await form.getByRole('button', { name: 'Save exercise' }).click();
    await page.getByRole('status').filter({ hasText: `Saved “${kept}”.` }).waitFor();
    const row = page.locator(`[data-exercise="${kept}"]`);
    expect(await row.textContent()).toContain('Cautions: Land softly; march on the spot if jumping hurts.');
    expect(await row.textContent()).toContain('Easier: Step out instead of jumping.');

    const mergeBox = page.locator('[data-merge-exercises]');
    await mergeBox.getByLabel('Merge this name…').selectOption({ label: merged });
    await mergeBox.getByLabel('…into this one (kept)').selectOption({ label: kept });
    await mergeBox.getByRole('button', { name: 'Review the merge' }).click();
    const confirm = page.getByRole('alertdialog');
    await confirm.waitFor();
    expect(await confirm.textContent()).toContain(`“${merged}” is used in 1 class and 0 studio templates.`);
    expect(await confirm.textContent()).toContain(`Exercises page class ${suffix}`);
    // Cancelling changes nothing.
    await confirm.getByRole('button', { name: 'Cancel' }).click();
    expect((await (await coach.get(`/api/lessons/${lesson.id}/plan`)).json()).plan.blocks[0].exercise).toBe(merged);

    await mergeBox.getByRole('button', { name: 'Review the merge' }).click();
    await page.screenshot({ path: `${SHOTS}/exercises-merge-confirm.png`, fullPage: true });
    await page.getByRole('alertdialog').getByRole('button', { name: 'Merge the names' }).click();
    await page.getByRole('status').filter({ hasText: `Merged “${merged}” into “${kept}”: 1 class and 0 templates` }).waitFor();
    expect(await page.locator('[data-exercise]').evaluateAll((els) => els.map((e) => e.getAttribute('data-exercise')))).toEqual([kept]);

    const plan = await (await coach.get(`/api/lessons/${lesson.id}/plan`)).json();
    expect(plan.plan.blocks[0].exercise).toBe(kept);
    await context.close();
  });
});
