import { chromium, type Browser } from 'playwright-core';
import { watchContext } from './browser-checks';

/**
 * Debian's Chromium, headless, with the flags this closed-network machine needs. Every context it
 * makes (browser.newContext, and browser.newPage's own) carries the shared checks of
 * tests/helpers/browser-checks.ts: API answers held to the OpenAPI document, CSP violations recorded.
 */
export async function launchBrowser(): Promise<Browser> {
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
  const newContext = browser.newContext.bind(browser);
  browser.newContext = async (options) => {
    const context = await newContext(options);
    await watchContext(context);
    return context;
  };
  return browser;
}

/** Where browser tests keep screenshots (a test artifact, gitignored). */
export const SHOTS = 'test-results/screenshots';
