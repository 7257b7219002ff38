// A visitor starts a studio through the real /start form (a refused colour shown at its field
// first), lands on the first-class checklist with the studio's join link, and the session works
// in the new studio; later the owner renames it, moves its address (the old link still leads
// there) and uploads a logo on the settings page. JavaScript is on, so the form offers the browser's own time zone, which the
// test sets (Europe/Lisbon, invented for the test) and then finds stored.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import type { Browser } from 'playwright-core';
import sharp from 'sharp';
import { BASE } from '../helpers/api-client';
import { launchBrowser, SHOTS } from '../helpers/browser';
import { signInAfterStart } from '../helpers/role-pages';
import { createAppDeps } from '~/server/app';
import { billingSettings, memberships, studios } from '~/db/schema';

const deps = createAppDeps(process.env.DATABASE_URL!);
let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await deps.pool.end();
});

describe('start a studio in the browser', () => {
  it('a visitor fills in the form, is told about an unreadable colour, then lands on the checklist with the join link', async () => {
    const context = await browser.newContext({ timezoneId: 'Europe/Lisbon' });
    const page = await context.newPage();
    const run = Date.now().toString(36);
    const slug = `story-${run}`;
    try {
      await page.goto(BASE() + '/start');
      // The browser's zone is offered as the default.
      expect(await page.getByLabel('Time zone').inputValue()).toBe('Europe/Lisbon');
      await page.getByLabel('Your name').fill('Story Founder');
      await page.getByLabel('E-mail').fill(`founder-${run}@story.example`);
      await page.getByLabel('Password').fill('a long enough password');
      await page.getByLabel('Studio name').fill('Story Pilates');
      await page.getByLabel('Address').fill(slug);
      await page.getByLabel('Currency').selectOption('gbp');
      await page.getByLabel('Monthly price').fill('12.50');
      await page.getByLabel('Free trial (days)').fill('10');
      // A mid grey neither white nor ink text reaches 4.5:1 on (WCAG 2.2 AA; worked in tests/unit/studio-rules.test.ts).
      await page.getByLabel('Accent colour').fill('#6f7a89');
      await page.getByRole('button', { name: 'Start my studio' }).click();
      const colourError = page.locator('[data-field-error="accentColour"]');
      await colourError.waitFor();
      expect(await colourError.textContent()).toContain('WCAG 2.2 AA asks for 4.5:1');
      expect(await deps.db.select().from(studios).where(eq(studios.slug, slug))).toHaveLength(0);

      await page.getByLabel('Password').fill('a long enough password');
      await page.getByLabel('Accent colour').fill('#2e5e4e');
      await page.getByRole('button', { name: 'Start my studio' }).click();
      await signInAfterStart(page, `founder-${run}@story.example`, 'a long enough password');
      await page.getByTestId('first-class-checklist').waitFor();
      expect(await page.getByRole('heading', { level: 1 }).textContent()).toBe('Welcome to Story Pilates');
      expect(await page.getByTestId('join-link').inputValue()).toBe(`${BASE()}/s/${slug}/join`);
      expect(await page.locator('[data-step-done="true"]').count()).toBe(0);
      await page.screenshot({ path: `${SHOTS}/start-studio-checklist.png`, fullPage: true });

      const [studio] = await deps.db.select().from(studios).where(eq(studios.slug, slug));
      expect(studio).toMatchObject({ name: 'Story Pilates', timeZone: 'Europe/Lisbon', accentColour: '#2E5E4E' });
      const [offer] = await deps.db.select().from(billingSettings).where(eq(billingSettings.studioId, studio!.id));
      expect(offer).toMatchObject({ currency: 'gbp', monthlyPriceMinor: 1250, trialDays: 10 });
      const owners = await deps.db.select().from(memberships).where(eq(memberships.studioId, studio!.id));
      expect(owners.map((m) => m.role)).toEqual(['owner']);

      // The staff pages work in the new studio: its (empty) class list, not Fernhill's.
      await page.goto(BASE() + '/studio/classes');
      expect(await page.content()).not.toContain('Lunch-hour Ladder');

      // Later the owner renames the studio, moves its address and adds a logo on the settings page.
      await page.getByRole('link', { name: 'Settings' }).first().click();
      await page.waitForURL((u) => u.pathname === '/studio/settings');
      const moved = `${slug}-moved`;
      await page.getByLabel('Studio name').fill('Story Pilates & Barre');
      await page.getByRole('textbox', { name: 'Address' }).fill(moved);
      await page.getByRole('button', { name: 'Save name, address and colour' }).click();
      await page.getByText(`Your studio’s address is /s/${moved}`).waitFor();
      expect(await page.getByTestId('studio-address').textContent()).toBe(`${BASE()}/s/${moved}`);
      // An invented logo: a 600 × 300 PNG made here.
      const logo = await sharp({ create: { width: 600, height: 300, channels: 4, background: { r: 46, g: 94, b: 78, alpha: 1 } } }).png().toBuffer();
      await page.getByLabel('Logo picture').setInputFiles({ name: 'story-logo.png', mimeType: 'image/png', buffer: logo });
      await page.getByRole('button', { name: 'Upload logo' }).click();
      await page.getByText('Logo saved.').waitFor();
      const headerLogo = page.locator('header img[data-studio-logo]');
      await headerLogo.waitFor();
      expect(await headerLogo.evaluate((img: HTMLImageElement) => [img.complete, img.naturalWidth, img.naturalHeight])).toEqual([true, 256, 128]);
      // A link to the old address leads to the moved studio's page, which shows the logo.
      await page.goto(`${BASE()}/s/${slug}`);
      expect(new URL(page.url()).pathname).toBe(`/s/${moved}`);
      await page.locator('img[data-studio-page-logo]').waitFor();
      expect(await page.getByText('Story Pilates & Barre').first().isVisible()).toBe(true);
      await page.screenshot({ path: `${SHOTS}/studio-page-after-move.png`, fullPage: true });
    } finally {
      await context.close();
    }
  });
});
