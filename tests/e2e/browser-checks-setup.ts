/**
 * Runs around every browser test (registered in tests/vitest.config.ts): a test fails when the
 * browser received an API answer the OpenAPI document does not describe, or when a page reported
 * a Content-Security-Policy violation (W3C Content Security Policy Level 3). Both are collected by
 * tests/helpers/browser-checks.ts on every context that launchBrowser() makes.
 */
import { afterEach, expect } from 'vitest';
import { takeBrowserFindings } from '../helpers/browser-checks';

afterEach(async () => {
  const { contractMismatches, cspViolations } = await takeBrowserFindings();
  expect(contractMismatches, 'API answers the browser received that the OpenAPI document does not describe').toEqual([]);
  expect(cspViolations, 'Content-Security-Policy violations reported by the page (securitypolicyviolation events)').toEqual([]);
});
