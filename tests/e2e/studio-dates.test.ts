// Dates in the studio's zone through real Chromium: the owner schedules a publish for the Monday
// after next spring's clock change by typing into the panel's field, sees it labelled with the
// zone, and the stored instant is the one the IANA rules give. Then the owner changes the studio's
// zone on the settings page and the same instant reads in the new zone. Forms run with JavaScript
// off (plain HTML forms posting to Astro Actions).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import type { Browser, Page } from 'playwright-core';
import { BASE, DEMO, signedIn } from '../helpers/api-client';
import { signedInPage } from '../helpers/role-pages';
import { launchBrowser, SHOTS } from '../helpers/browser';
import { createAppDeps } from '~/server/app';
import { lessons } from '~/db/schema';

const deps = createAppDeps(process.env.DATABASE_URL!);
let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

async function signInAs(email: string): Promise<Page> {
  return (await signedInPage(browser, email, { javaScriptEnabled: false })).page;
}

/**
 * The last Sunday of March of a year (the EU rule "Mar lastSu" in the IANA tz database, file
 * `europe`: summer time starts then at 01:00 UTC), as a calendar day.
 */
function lastSundayOfMarch(year: number): number {
  const march31 = new Date(Date.UTC(year, 2, 31));
  return 31 - march31.getUTCDay();
}

async function setStudioClock(page: Page, timeZone: string) {
  await page.goto(BASE() + '/studio/settings');
  await page.getByLabel('Time zone').selectOption(timeZone);
  await page.getByRole('button', { name: 'Save', exact: true }).click();
  await page.getByRole('status').filter({ hasText: `Dates now read in ${timeZone}` }).waitFor();
}

describe('a scheduled publish in the studio’s zone', () => {
  it('the owner schedules the Monday after the clock change at 09:00 Berlin time and sees it labelled', async () => {
    const owner = await signedIn(DEMO.owner);
    const lesson = await (await owner.post('/api/lessons', { title: `Scheduled across the change ${Date.now()}`, advertisedMinutes: 10, impact: 'low' })).json();
    const page = await signInAs(DEMO.owner);
    try {
      await setStudioClock(page, 'Europe/Berlin');
      const year = new Date().getUTCFullYear() + 1;
      const monday = lastSundayOfMarch(year) + 1;
      const wallClock = `${year}-03-${String(monday).padStart(2, '0')}T09:00`;

      await page.goto(`${BASE()}/studio/classes/${lesson.id}`);
      const panel = page.getByTestId('publish-panel');
      const field = panel.getByLabel(/Publish later at \(Europe\/Berlin time/);
      await field.fill(wallClock);
      await panel.getByRole('button', { name: 'Schedule' }).click();
      await page.getByTestId('scheduled-publish').waitFor();

      // CEST = UTC+2 from the last Sunday of March (IANA tz database, rule "R E 1981 ma - Mar lastSu 1u 1 S"): 09:00 is 07:00 UTC.
      const [row] = await deps.db.select({ publishAt: lessons.publishAt }).from(lessons).where(eq(lessons.id, lesson.id));
      expect(row!.publishAt!.toISOString()).toBe(`${wallClock.slice(0, 10)}T07:00:00.000Z`);
      const label = await page.getByTestId('scheduled-publish').textContent();
      expect(label).toContain(`${monday} Mar ${year}, 09:00 CEST (Europe/Berlin)`);
      // The field shows the schedule back in the studio's time.
      expect(await field.inputValue()).toBe(wallClock);
      await page.screenshot({ path: `${SHOTS}/studio-dates-scheduled.png`, fullPage: true });

      // The same instant, read in another zone once the owner changes the studio's zone
      // (New York is on summer time, UTC−4, by then: it starts on the second Sunday of March. In the
      // studio's en-GB locale Intl writes that zone as "GMT-4": the CLDR data Node ships has no
      // English-UK abbreviation for American zones — seen here, not from a standard).
      await setStudioClock(page, 'America/New_York');
      await page.goto(`${BASE()}/studio/classes/${lesson.id}`);
      expect(await page.getByTestId('scheduled-publish').textContent()).toContain(`${monday} Mar ${year}, 03:00 GMT-4 (America/New_York)`);
    } finally {
      await setStudioClock(page, 'Europe/Berlin');
      await page.context().close();
    }
  });

  it('refuses a time the clocks skip, saying why, and keeps nothing', async () => {
    const owner = await signedIn(DEMO.owner);
    const lesson = await (await owner.post('/api/lessons', { title: `Skipped hour ${Date.now()}`, advertisedMinutes: 10, impact: 'low' })).json();
    const page = await signInAs(DEMO.owner);
    try {
      const year = new Date().getUTCFullYear() + 1;
      const sunday = String(lastSundayOfMarch(year)).padStart(2, '0');
      await page.goto(`${BASE()}/studio/classes/${lesson.id}`);
      const panel = page.getByTestId('publish-panel');
      await panel.getByLabel(/Publish later at/).fill(`${year}-03-${sunday}T02:30`);
      await panel.getByRole('button', { name: 'Schedule' }).click();
      await page.getByRole('alert').filter({ hasText: 'The clocks skip that time in Europe/Berlin' }).waitFor();
      const [row] = await deps.db.select({ publishAt: lessons.publishAt }).from(lessons).where(eq(lessons.id, lesson.id));
      expect(row!.publishAt).toBeNull();
    } finally {
      await page.context().close();
    }
  });
});
