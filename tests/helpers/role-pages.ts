import type { Browser, BrowserContext, BrowserContextOptions, Page } from 'playwright-core';
import { BASE, DEMO, DEMO_PASSWORD, signedIn } from './api-client';

export type DemoRole = keyof typeof DEMO;

/**
 * Every page each demo role can reach from the navigation and the class lists (demo data from
 * shared/design.md). Pages that need a class use the published Desk-Break Mobility and the
 * draft Hill Sprints Prep.
 */
export async function pagesByRole(): Promise<Record<DemoRole, string[]>> {
  const owner = await signedIn(DEMO.owner);
  const lessons = (await (await owner.get('/api/lessons')).json()).lessons as { id: string; slug: string }[];
  const desk = lessons.find((l) => l.slug === 'desk-break-mobility')!;
  const hill = lessons.find((l) => l.slug === 'hill-sprints-prep')!;
  const staffClassPages = ['/studio', '/studio/classes', '/studio/exercises', `/studio/classes/${desk.id}`, `/studio/classes/${hill.id}`];
  const everyone = ['/s/fernhill', '/s/fernhill/library', '/s/fernhill/library/history', '/s/fernhill/classes/desk-break-mobility', '/account'];
  return {
    owner: [...staffClassPages, `/studio/classes/${desk.id}/insights`, '/studio/members', '/studio/billing', '/studio/team', '/studio/settings', '/studio/mail', ...everyone],
    coach: [...staffClassPages, `/studio/classes/${desk.id}/insights`, ...everyone],
    // The editor also opens the owner's pages (they are linked nowhere for editors, but URLs get shared).
    editor: [...staffClassPages, '/studio/members', '/studio/team', ...everyone],
    member: [...everyone, '/account/membership'],
  };
}

/** Pages anyone can open without signing in. */
export const PUBLIC_PAGES = ['/', '/sign-in', '/s/fernhill', '/s/fernhill/join', '/forgot-password'];

/**
 * Signs in through the sign-in form with the real controls, as a person does, and waits until the
 * form has let them in. Where they land is the caller's check.
 */
export async function signInThroughForm(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto(BASE() + '/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((u) => u.pathname !== '/sign-in');
}

/** A new browser context (viewport, JavaScript, motion as given) signed in through the form. */
export async function signedInPage(browser: Browser, email: string, options: BrowserContextOptions = {}): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext(options);
  const page = await context.newPage();
  await signInThroughForm(page, email);
  return { context, page };
}

/** A browser context signed in as a demo role through the sign-in form. */
export function signedInContext(browser: Browser, role: DemoRole, viewport: { width: number; height: number }, options: { reducedMotion?: 'reduce' | 'no-preference' } = {}): Promise<{ context: BrowserContext; page: Page }> {
  return signedInPage(browser, DEMO[role], { viewport, ...options });
}

/**
 * After the /start form: a visitor is told to check their inbox (the same answer whether or not
 * the address had an account), follows "Sign in", and lands on the new studio's checklist.
 */
export async function signInAfterStart(page: Page, email: string, password: string): Promise<void> {
  await page.getByRole('status').filter({ hasText: 'Check your inbox' }).waitFor();
  await page.locator('#main').getByRole('link', { name: 'Sign in' }).click();
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((u) => u.pathname === '/studio/welcome');
}
