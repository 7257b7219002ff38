// An owner connects the studio's payments through the real controls: the first-class checklist's
// "Connect payments" step, the Payments section's button, the payment provider's onboarding page
// (the local fake's, filled in like a person would, a wrong IBAN refused first) and back to the
// Payments section, which then says the studio can take payments. The studio, its owner and the
// bank details are invented for the test.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import type { Browser } from 'playwright-core';
import { ApiClient, BASE } from '../helpers/api-client';
import { launchBrowser, SHOTS } from '../helpers/browser';
import { createAppDeps } from '~/server/app';
import { paymentAccounts, studios } from '~/db/schema';

const deps = createAppDeps(process.env.DATABASE_URL!);
let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await deps.pool.end();
});

describe('connect payments in the browser', () => {
  it('the owner goes from the checklist to the provider’s page and back, and the studio can sell', async () => {
    const run = `${Date.now().toString(36)}${Math.floor(Math.random() * 1e4).toString(36)}`;
    const email = `payments-${run}@connect.example`;
    const slug = `pay-${run}`;
    // The studio is started through the API (the form has its own browser test), then the owner signs in here.
    const api = new ApiClient();
    await api.signUpAndIn({ name: 'Payments Owner', email, password: 'a long enough password' });
    const started = await api.post('/api/studios', { name: 'Payments Pilates', slug, timeZone: 'Europe/Berlin', currency: 'eur', monthlyPriceMinor: 1400, trialDays: 7, accentColour: '#2E5E4E' });
    expect(started.status).toBe(201);
    const [studio] = await deps.db.select().from(studios).where(eq(studios.slug, slug));

    const context = await browser.newContext();
    const page = await context.newPage();
    try {
      await page.goto(BASE() + '/sign-in');
      await page.getByLabel('E-mail').fill(email);
      await page.getByLabel('Password').fill('a long enough password');
      await page.getByRole('button', { name: 'Sign in' }).click();
      // In two studios (a member at the app's own, owner of the new one): choose the new one.
      await page.waitForURL((u) => u.pathname === '/studios');
      await page.getByRole('button', { name: /Payments Pilates/ }).click();
      await page.waitForURL((u) => u.pathname !== '/studios');

      await page.goto(BASE() + '/studio/welcome');
      const step = page.getByRole('link', { name: 'Connect payments' });
      await step.click();
      await page.waitForURL((u) => u.pathname === '/studio/billing');
      const section = page.getByTestId('payments');
      expect(await section.getAttribute('data-state')).toBe('none');
      expect(await page.getByTestId('payments-state').textContent()).toBe('Not connected');

      await section.getByRole('button', { name: 'Connect payments' }).click();
      await page.waitForURL((u) => u.pathname.startsWith('/connect/onboarding/'));
      await page.getByLabel('Business name').fill('Payments Pilates GmbH');
      // Check digits wrong (ISO 13616 mod-97): refused on the provider's page.
      await page.getByLabel('Bank account for payouts (IBAN)').fill('DE00 3704 0044 0532 0130 00');
      await page.getByLabel('I accept the test service agreement.').check();
      await page.getByRole('button', { name: 'Agree and submit' }).click();
      await page.getByRole('alert').waitFor();
      expect(await page.getByRole('alert').textContent()).toContain('That IBAN is not valid');
      // The example IBAN published with ISO 13616 explanations (secondary); the fake checks its digits.
      await page.getByLabel('Bank account for payouts (IBAN)').fill('DE89 3704 0044 0532 0130 00');
      await page.getByRole('button', { name: 'Agree and submit' }).click();

      await page.waitForURL((u) => u.pathname === '/studio/billing' && u.searchParams.get('payments') === 'returned');
      await page.getByTestId('payments').waitFor();
      expect(await page.getByTestId('payments').getAttribute('data-state')).toBe('ready');
      expect(await page.getByTestId('payments-state').textContent()).toBe('Ready to take payments');
      expect(await page.getByRole('status').first().textContent()).toContain('Payments are connected');
      expect(await page.getByTestId('payments-charges').textContent()).toBe('Yes');
      expect(await page.getByTestId('payments-payouts').textContent()).toBe('On');
      await page.screenshot({ path: `${SHOTS}/connect-payments-ready.png`, fullPage: true });
      const [row] = await deps.db.select().from(paymentAccounts).where(eq(paymentAccounts.studioId, studio!.id));
      expect(row).toMatchObject({ chargesEnabled: true, payoutsEnabled: true, detailsSubmitted: true });

      // The checklist's step is ticked now.
      await page.goto(BASE() + '/studio/welcome');
      const ticked = page.locator('li', { has: page.getByRole('link', { name: 'Connect payments' }) });
      expect(await ticked.getAttribute('data-step-done')).toBe('true');
    } finally {
      await context.close();
    }
  });
});
