/**
 * Checks that run in every browser test, on every context made by `launchBrowser()`:
 * - each answer the browser receives from our API (/api/** on the app's origin) is held to the
 *   OpenAPI document, exactly as the ApiClient holds the integration tests' answers
 *   (tests/helpers/openapi-contract.ts);
 * - every Content-Security-Policy violation the page reports (the `securitypolicyviolation`
 *   event of W3C Content Security Policy Level 3, §5.3 "Report a violation") is recorded.
 * The e2e project's set-up file (tests/e2e/browser-checks-setup.ts) fails each test that
 * collected either, after awaiting the checks still running.
 */
import { appendFileSync } from 'node:fs';
import type { BrowserContext, Response } from 'playwright-core';
import { BASE } from './api-client';
import { assertDocumentedAnswer } from './openapi-contract';

const pending = new Set<Promise<void>>();
let contractMismatches: string[] = [];
let cspViolations: string[] = [];
/** Answers checked, and answers whose body the browser no longer had (the page had moved on). */
export const browserAnswerCounts = { checked: 0, bodyGone: 0 };

class BodyGone extends Error {}

function checkAnswer(res: Response): void {
  const url = new URL(res.url());
  if (url.origin !== new URL(BASE()).origin || !url.pathname.startsWith('/api/')) return;
  const method = res.request().method();
  const check = assertDocumentedAnswer(BASE(), method, res.url(), {
    status: res.status(),
    contentType: res.headers()['content-type'] ?? '',
    text: () => res.text().catch((e: unknown) => Promise.reject(new BodyGone(String(e)))),
  })
    .then(() => void browserAnswerCounts.checked++)
    .catch((e: unknown) => {
      if (e instanceof BodyGone) return void browserAnswerCounts.bodyGone++;
      const message = `browser: ${e instanceof Error ? e.message : String(e)}`;
      // CONTRACT_REPORT=<file> lists every mismatch of a run instead of failing (for surveying drift).
      if (process.env.CONTRACT_REPORT) appendFileSync(process.env.CONTRACT_REPORT, `${message}\n---\n`);
      else contractMismatches.push(message);
    });
  pending.add(check);
  void check.finally(() => pending.delete(check));
}

/** In the page, before its own scripts: forward each CSP violation to the test. */
const LISTEN_FOR_CSP_VIOLATIONS = `document.addEventListener('securitypolicyviolation', (e) => {
  window.__rmCspViolation?.({ directive: e.effectiveDirective, blocked: e.blockedURI, source: e.sourceFile, line: e.lineNumber, sample: e.sample, page: location.pathname, disposition: e.disposition });
});`;

interface Violation { directive: string; blocked: string; source: string; line: number; sample: string; page: string; disposition: string }

/** Attaches both checks to a context (launchBrowser does this for every context it makes). */
export async function watchContext(context: BrowserContext): Promise<void> {
  context.on('response', checkAnswer);
  await context.exposeFunction('__rmCspViolation', (v: Violation) => {
    cspViolations.push(`${v.page}: ${v.directive} refused ${v.blocked || '(inline)'}${v.sample ? ` «${v.sample}»` : ''}${v.source ? ` at ${v.source}:${v.line}` : ''} (${v.disposition})`);
  });
  await context.addInitScript(LISTEN_FOR_CSP_VIOLATIONS);
}

/** The CSP violations reported so far in this test, handed over and forgotten (for tests that provoke one on purpose). */
export function takeCspViolations(): string[] {
  const found = cspViolations;
  cspViolations = [];
  return found;
}

/** The CSP violations reported so far in this test, left in place for the end-of-test check. */
export const cspViolationsSoFar = (): readonly string[] => [...cspViolations];

/** Waits for the checks still running, then hands over (and forgets) what was found. */
export async function takeBrowserFindings(): Promise<{ contractMismatches: string[]; cspViolations: string[] }> {
  while (pending.size) await Promise.allSettled([...pending]);
  const found = { contractMismatches, cspViolations };
  contractMismatches = [];
  cspViolations = [];
  return found;
}
