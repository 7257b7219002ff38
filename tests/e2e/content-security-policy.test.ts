/**
 * Content-Security-Policy in the browser (W3C Content Security Policy Level 3): every page of
 * every demo role (the list the axe test uses) and the public pages load with the app's policy
 * on, a member plays a class (hls.js: blob: media through Media Source Extensions, its worker,
 * segments from presigned store URLs) and a coach opens the timeline editor (peaks and media from
 * the store). Any `securitypolicyviolation` event a page fires fails the test: they are recorded
 * by tests/helpers/browser-checks.ts on every context launchBrowser() makes, asserted here after
 * each stage and again after every browser test by tests/e2e/browser-checks-setup.ts.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page, Response } from 'playwright-core';
import { BASE } from '../helpers/api-client';
import { launchBrowser } from '../helpers/browser';
import { cspViolationsSoFar, takeCspViolations } from '../helpers/browser-checks';
import { ensureDeskBreakPublished } from '../helpers/demo-class';
import { startPlayingMuted } from '../helpers/player';
import { pagesByRole, PUBLIC_PAGES, signedInContext, type DemoRole } from '../helpers/role-pages';

const VIEWPORT = { width: 1280, height: 900 };
let browser: Browser;
let pages: Record<DemoRole, string[]>;
let desk: { id: string; slug: string };

beforeAll(async () => {
  desk = await ensureDeskBreakPublished();
  pages = await pagesByRole();
  browser = await launchBrowser();
}, 360_000);
afterAll(() => browser?.close());

/** The directives of a policy header, by name (CSP Level 3 §2.2.1: name, then its sources). */
function directives(policy: string | null): Map<string, string[]> {
  const out = new Map<string, string[]>();
  for (const part of (policy ?? '').split(';')) {
    const [name, ...sources] = part.trim().split(/\s+/);
    if (name) out.set(name.toLowerCase(), sources);
  }
  return out;
}

/** The page's own answer carries the full policy: no inline or eval for scripts, never framed. */
function expectStrictPolicy(res: Response | null, path: string) {
  expect(res, path).not.toBeNull();
  const d = directives(res!.headers()['content-security-policy'] ?? null);
  const scripts = d.get('script-src') ?? [];
  expect(scripts, `${path} script-src`).toContain("'self'");
  expect(scripts, `${path} script-src`).not.toContain("'unsafe-inline'");
  expect(scripts, `${path} script-src`).not.toContain("'unsafe-eval'");
  expect(d.get('frame-ancestors'), path).toEqual(["'none'"]);
  expect(d.get('object-src'), path).toEqual(["'none'"]);
  expect(d.get('base-uri'), path).toEqual(["'self'"]);
  expect(d.get('form-action')?.[0], path).toBe("'self'");
}

/** Opens a page and waits until every island has hydrated (Astro drops `ssr` then). */
async function open(page: Page, path: string) {
  const res = await page.goto(BASE() + path);
  await page.waitForLoadState('load');
  await page.waitForFunction(() => !document.querySelector('astro-island[ssr]'));
  expectStrictPolicy(res, path);
}

describe('the Content-Security-Policy in the browser', () => {
  it('a violation is noticed: an inline script added by hand is refused and reported', async () => {
    // The negative control: without it, an empty list could also mean the listener never ran.
    const context = await browser.newContext({ viewport: VIEWPORT });
    const page = await context.newPage();
    await open(page, '/sign-in');
    const ran = await page.evaluate(() => {
      const s = document.createElement('script');
      s.textContent = 'window.__inlineRan = true';
      document.body.append(s);
      return (window as unknown as { __inlineRan?: boolean }).__inlineRan === true;
    });
    expect(ran).toBe(false);
    await expect.poll(() => cspViolationsSoFar().length).toBeGreaterThan(0);
    expect(takeCspViolations().join('\n')).toMatch(/script-src-elem refused inline/);
    await context.close();
  });

  it('public pages load without a violation', async () => {
    const context = await browser.newContext({ viewport: VIEWPORT });
    const page = await context.newPage();
    for (const path of PUBLIC_PAGES) await open(page, path);
    expect(cspViolationsSoFar()).toEqual([]); // CSP Level 3 §5.3: each violation fires securitypolicyviolation
    await context.close();
  });

  it.each(['owner', 'coach', 'editor', 'member'] as const)('every page of the %s loads without a violation', async (role) => {
    const { context, page } = await signedInContext(browser, role, VIEWPORT);
    for (const path of pages[role]) await open(page, path);
    expect(cspViolationsSoFar()).toEqual([]); // CSP Level 3 §5.3: each violation fires securitypolicyviolation
    await context.close();
  });

  it('a member plays a class: hls.js, its worker, blob: media and presigned segments are allowed', async () => {
    const { context, page } = await signedInContext(browser, 'member', VIEWPORT);
    const segments: string[] = [];
    page.on('response', (r) => {
      if (/\.(ts|m4s)(\?|$)/.test(new URL(r.url()).pathname) && r.ok()) segments.push(r.url());
    });
    await open(page, `/classes/${desk.slug}`);
    const video = await startPlayingMuted(page);
    // Playing means media really flowed: a second of it decoded.
    await page.waitForFunction(() => (document.querySelector('video') as HTMLVideoElement).currentTime > 1, undefined, { timeout: 60_000 });
    const source = await video.evaluate((v: HTMLVideoElement) => v.currentSrc);
    expect(segments.length).toBeGreaterThan(0);
    // Where hls.js drives the video, its source is an MSE blob: URL (media-src blob:).
    expect(source).toMatch(/^blob:|\.m3u8/);
    expect(cspViolationsSoFar()).toEqual([]); // CSP Level 3 §5.3
    await context.close();
  });

  it('a coach opens the timeline editor with its waveform and video', async () => {
    const { context, page } = await signedInContext(browser, 'coach', VIEWPORT);
    await open(page, `/studio/classes/${desk.id}`);
    await page.locator('[data-editor-ready="true"]').waitFor({ timeout: 60_000 });
    await page.getByRole('heading', { name: 'Timeline', level: 2 }).waitFor();
    expect(cspViolationsSoFar()).toEqual([]); // CSP Level 3 §5.3
    await context.close();
  });
});
