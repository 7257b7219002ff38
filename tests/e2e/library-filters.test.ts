/**
 * Library filters through the real form: an empty search box is "not set", the ticked boxes
 * apply and stay ticked, and a value the form does not know (an old bookmark) shows a message
 * next to its filter while the other filters still apply.
 */
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { BASE, DEMO, signedIn } from '../helpers/api-client';
import { launchBrowser } from '../helpers/browser';
import { ensureDeskBreakPublished } from '../helpers/demo-class';
import { createSmallClass } from '../helpers/published-class';
import { signInThroughForm } from '../helpers/role-pages';

let browser: Browser;
let dir: string;
let highImpactSlug = '';

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'roundmark-filters-'));
  await ensureDeskBreakPublished();
  // A published class that the filters must leave out (high impact, invented for this test).
  const coach = await signedIn(DEMO.coach);
  const cls = await createSmallClass(coach, dir, `Filter foil ${Date.now()}`, { impact: 'high' });
  const res = await coach.post(`/api/lessons/${cls.lessonId}/publish`, { acknowledgeWarnings: true });
  if (res.status !== 201) throw new Error(`publish failed: ${res.status} ${await res.text()}`);
  highImpactSlug = cls.slug;
  browser = await launchBrowser();
}, 360_000);
afterAll(async () => {
  await browser?.close();
  await rm(dir, { recursive: true, force: true });
});

async function signInAsMember(page: Page) {
  await signInThroughForm(page, DEMO.member);
  await page.waitForURL(BASE() + '/s/fernhill/library');
}

const cardSlugs = (page: Page) => page.locator('[data-class-card]').evaluateAll((els) => els.map((e) => e.getAttribute('data-class-card')));

describe('library filters', () => {
  it('apply with an empty search box, and the ticked boxes stay ticked', async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await signInAsMember(page);
    expect(await cardSlugs(page)).toContain(highImpactSlug);
    expect(await page.getByLabel('Search').inputValue()).toBe('');

    await page.getByLabel('Low impact').check();
    await page.getByLabel('Under 15 min').check();
    await page.getByRole('button', { name: 'Show classes' }).click();
    await page.waitForURL(/impact=low/);
    expect(page.url()).toContain('q=&'); // the form sends the empty search box, as browsers do
    const slugs = await cardSlugs(page);
    expect(slugs).toContain('desk-break-mobility');
    expect(slugs).not.toContain(highImpactSlug);
    expect(await page.getByLabel('Low impact').isChecked()).toBe(true);
    expect(await page.getByLabel('Under 15 min').isChecked()).toBe(true);
    expect(await page.locator('[data-filter-problem]').count()).toBe(0);

    // Unticking one box and sending again widens the list again.
    await page.getByLabel('Low impact').uncheck();
    await page.getByRole('button', { name: 'Show classes' }).click();
    await page.waitForURL((u) => !u.search.includes('impact=low'));
    expect(await cardSlugs(page)).toContain(highImpactSlug);
    expect(await page.getByLabel('Under 15 min').isChecked()).toBe(true);
    await context.close();
  });

  it('shows a message next to a filter whose value it does not know, and keeps the others', async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await signInAsMember(page);
    // An old bookmark or a shared link with a value the form cannot produce: only a URL gets here.
    await page.goto(BASE() + '/library?q=&impact=gentle&impact=low&length=under-15');
    const problem = page.locator('[data-filter-problem="impact"]');
    await problem.waitFor();
    expect(await problem.textContent()).toContain('“gentle”');
    expect(await page.getByLabel('Low impact').isChecked()).toBe(true);
    expect(await page.getByLabel('Under 15 min').isChecked()).toBe(true);
    const slugs = await cardSlugs(page);
    expect(slugs).toContain('desk-break-mobility');
    expect(slugs).not.toContain(highImpactSlug);
    await context.close();
  });
});
