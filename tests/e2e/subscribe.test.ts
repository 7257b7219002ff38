/**
 * A visitor becomes a member: signs up, confirms the e-mail address by the e-mailed link (when
 * the app sends one), starts the free trial through the payment provider's hosted page (the
 * local fake) with a promo code, is declined once with the test card that always fails (and
 * gets nothing), pays with the test card that succeeds, and plays a class.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser } from 'playwright-core';
import { BASE, DEMO, signedIn } from '../helpers/api-client';
import { launchBrowser, SHOTS } from '../helpers/browser';
import { createSmallClass } from '../helpers/published-class';
import { waitForMessage } from '../helpers/mail-box';
import { signInThroughForm } from '../helpers/role-pages';
import { CARD_DECLINED, CARD_OK, registerWebhook, testStripe } from '../helpers/payments';

let browser: Browser;
let dir: string;
let cls: { lessonId: string; slug: string; recordingId: string };
let promoCode: string;

beforeAll(async () => {
  await registerWebhook(testStripe());
  dir = await mkdtemp(join(tmpdir(), 'roundmark-subscribe-'));
  const coach = await signedIn(DEMO.coach);
  cls = await createSmallClass(coach, dir, `Subscribe story ${Date.now()}`);
  const pub = await coach.post(`/api/lessons/${cls.lessonId}/publish`, { acknowledgeWarnings: true });
  if (pub.status !== 201) throw new Error(`publish: ${pub.status} ${await pub.text()}`);
  promoCode = `WELCOME${Date.now().toString(36).toUpperCase()}`;
  const owner = await signedIn(DEMO.owner);
  const res = await owner.post('/api/billing/promo-codes', { code: promoCode, percentOff: 25 });
  if (res.status !== 201) throw new Error(`promo: ${res.status} ${await res.text()}`);
  browser = await launchBrowser();
}, 240_000);
afterAll(async () => {
  await browser?.close();
  await rm(dir, { recursive: true, force: true });
});

describe('a visitor subscribes', () => {
  it('signs up, is declined once, starts the trial with a promo code and plays a class', async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    const email = `visitor-${Date.now()}@test.example`;
    const started = new Date();
    await page.goto(BASE() + '/sign-up');
    await page.getByLabel('Your name').fill('Robin Vale');
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password').fill('a long enough password');
    await page.getByRole('button', { name: 'Create account' }).click();
    // Sign-up answers "check your inbox" for every address (no session); then the visitor signs in.
    await page.getByRole('status').filter({ hasText: 'Check your inbox' }).waitFor();
    await signInThroughForm(page, email, 'a long enough password');

    // Confirm the address through the e-mailed link, if the app sends one.
    const mail = await waitForMessage(email, { since: started, timeoutMs: 8000 }).catch(() => null);
    if (mail) {
      const link = /https?:\/\/\S*verify-email\S*/.exec(mail.parsed.text ?? '')?.[0];
      expect(link, 'the confirmation e-mail holds a link').toBeTruthy();
      await page.goto(link!);
      await page.goto(BASE() + '/account');
      expect(await page.locator('[data-verify-banner]').count()).toBe(0);
    }

    // Before subscribing, the class page offers the trial instead of the player.
    await page.goto(`${BASE()}/classes/${cls.slug}`);
    await page.getByTestId('membership-offer').waitFor();
    await page.getByRole('link', { name: 'Start your free trial' }).click();
    await page.waitForURL(/\/account#membership$/);

    await page.getByLabel(/Promo code/).fill(promoCode.toLowerCase());
    await page.screenshot({ path: `${SHOTS}/membership-start.png`, fullPage: true });
    await page.getByRole('button', { name: 'Start your free trial' }).click();
    await page.waitForURL(/\/pay\/cs_test_/);
    const payUrl = page.url();
    expect(await page.textContent('body')).toMatch(new RegExp(`Code ${promoCode}: 25% off`));
    expect(await page.textContent('body')).toMatch(/Free for \d+ days/);

    // The card that is always declined: the page says so and nothing is granted.
    await page.getByLabel('Card number').fill(CARD_DECLINED);
    await page.getByLabel('Expiry (MM/YY)').fill('12/40');
    await page.getByLabel('Security code').fill('123');
    await page.getByRole('button', { name: 'Start free trial' }).click();
    await expect.poll(() => page.getByRole('alert').textContent()).toContain('Your card was declined');
    expect(page.url()).toBe(payUrl);
    await page.screenshot({ path: `${SHOTS}/pay-declined.png`, fullPage: true });
    const after = await (await page.request.get(BASE() + '/api/billing/membership')).json();
    expect(after).toMatchObject({ status: 'none', entitled: false });
    const media = await page.request.get(`${BASE()}/media/${cls.recordingId}/hls/master.m3u8`);
    expect(media.status()).toBe(404);

    // The succeeding card: back on the account page, on trial, with the code.
    await page.getByLabel('Card number').fill(CARD_OK);
    await page.getByLabel('Expiry (MM/YY)').fill('12/40');
    await page.getByLabel('Security code').fill('123');
    await page.getByRole('button', { name: 'Start free trial' }).click();
    await page.waitForURL(/\/account\?checkout=success/);
    await expect.poll(() => page.getByTestId('membership-status').textContent()).toContain('On trial');
    expect(await page.getByTestId('membership-panel').textContent()).toContain(`code ${promoCode} applied`);
    await page.screenshot({ path: `${SHOTS}/membership-trial.png`, fullPage: true });

    // And the class plays.
    await page.goto(`${BASE()}/classes/${cls.slug}`);
    await page.waitForSelector('astro-island:not([ssr])');
    await page.getByRole('button', { name: /I understand/ }).click();
    const video = page.getByTestId('class-video');
    await video.evaluate((v: HTMLVideoElement) => {
      v.muted = true;
      return v.play();
    });
    await page.waitForFunction(() => (document.querySelector('video') as HTMLVideoElement).currentTime > 0.5, undefined, { timeout: 30_000 });
    await page.screenshot({ path: `${SHOTS}/member-plays-after-trial.png`, fullPage: true });
    await context.close();
  });
});
