/**
 * axe-core (npm, 4.x) on every page of every demo role at desktop (1366 × 900) and phone
 * (390 × 844) widths: no serious or critical violations of the WCAG 2.0/2.1/2.2 A and AA rules.
 * The rules axe ran are printed once. Also: prefers-reduced-motion stops the clock ring moving.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { BASE } from '../helpers/api-client';
import { launchBrowser } from '../helpers/browser';
import { ensureDeskBreakPublished } from '../helpers/demo-class';
import { pagesByRole, PUBLIC_PAGES, signedInContext, type DemoRole } from '../helpers/role-pages';

const AXE_SOURCE = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');
// axe's tags for WCAG 2.0, 2.1 and 2.2 levels A and AA (axe-core documentation, "Axe-core Tags").
const TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'];
const SIZES = { desktop: { width: 1366, height: 900 }, phone: { width: 390, height: 844 } } as const;

let browser: Browser;
let pages: Record<DemoRole, string[]>;
const rulesRun = new Set<string>();

beforeAll(async () => {
  await ensureDeskBreakPublished();
  pages = await pagesByRole();
  browser = await launchBrowser();
}, 360_000);
afterAll(async () => {
  console.log(`axe-core rules run (${rulesRun.size}, tags ${TAGS.join(', ')}): ${[...rulesRun].sort().join(', ')}`);
  await browser?.close();
});

interface AxeResult {
  violations: { id: string; impact: string | null; help: string; nodes: { target: string[]; failureSummary?: string }[] }[];
  passes: { id: string }[];
  incomplete: { id: string }[];
  inapplicable: { id: string }[];
}

async function seriousViolations(page: Page): Promise<string[]> {
  // Evaluated through the DevTools protocol: the page's CSP (rightly) refuses an inline <script>.
  await page.evaluate(AXE_SOURCE);
  const result = (await page.evaluate((tags) => (window as unknown as { axe: { run: (c: unknown, o: unknown) => Promise<unknown> } }).axe.run(document, { runOnly: { type: 'tag', values: tags } }), TAGS)) as AxeResult;
  for (const group of [result.violations, result.passes, result.incomplete, result.inapplicable]) for (const r of group) rulesRun.add(r.id);
  return result.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .flatMap((v) => v.nodes.slice(0, 3).map((n) => `${v.id} (${v.impact}): ${n.target.join(' ')} — ${n.failureSummary?.split('\n')[1]?.trim() ?? v.help}`));
}

describe.each(Object.entries(SIZES))('axe at %s size', (_name, viewport) => {
  it.each(['owner', 'coach', 'editor', 'member'] as const)('every page of the %s: no serious or critical violations', async (role) => {
    const { context, page } = await signedInContext(browser, role, viewport);
    const found: string[] = [];
    for (const path of pages[role]) {
      await page.goto(BASE() + path);
      await page.waitForLoadState('load');
      // Islands hydrate before they are checked (their markup changes once React owns it).
      await page.waitForFunction(() => !document.querySelector('astro-island[ssr]'));
      found.push(...(await seriousViolations(page)).map((v) => `${path}: ${v}`));
    }
    expect(found).toEqual([]);
    await context.close();
  });

  it('every public page: no serious or critical violations', async () => {
    const context = await browser.newContext({ viewport });
    const page = await context.newPage();
    const found: string[] = [];
    for (const path of PUBLIC_PAGES) {
      await page.goto(BASE() + path);
      found.push(...(await seriousViolations(page)).map((v) => `${path}: ${v}`));
    }
    expect(found).toEqual([]);
    await context.close();
  });
});

describe('reduced motion', () => {
  const ringOffsets = async (reducedMotion: 'reduce' | 'no-preference') => {
    const { context, page } = await signedInContext(browser, 'member', SIZES.desktop, { reducedMotion });
    await page.goto(BASE() + '/classes/desk-break-mobility');
    await page.waitForFunction(() => !document.querySelector('astro-island[ssr]'));
    const understand = page.getByRole('button', { name: /I understand/ });
    if (await understand.count()) await understand.click();
    await page.getByTestId('interval-clock').waitFor();
    const video = page.getByTestId('class-video');
    await video.evaluate((v: HTMLVideoElement) => {
      v.muted = true;
      v.currentTime = 12;
      void v.play();
    });
    const ring = page.locator('[data-clock-ring-progress]');
    const read = () => ring.evaluate((c) => getComputedStyle(c).strokeDashoffset);
    const first = await read();
    // Wait for the state (playback moved on by a second), not for a time.
    await page.waitForFunction(() => (document.querySelector('video') as HTMLVideoElement).currentTime > 13.2);
    const second = await read();
    await context.close();
    return [first, second];
  };

  it('the clock ring moves normally and stands still with prefers-reduced-motion: reduce', async () => {
    const [a, b] = await ringOffsets('no-preference');
    expect(a).not.toBe(b);
    const [c, d] = await ringOffsets('reduce');
    expect([c, d]).toEqual(['0px', '0px']);
  });
});
