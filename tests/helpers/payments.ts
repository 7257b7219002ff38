/**
 * Test helpers for the payments fake (docker-free-dev/payments-fake.mjs): the official SDK
 * pointed at it, its test-only controls, paying on its hosted card page, and waiting for the
 * app to have applied the webhooks.
 */
import Stripe from 'stripe';
import { ApiClient, BASE } from './api-client';

export const PAY_URL = process.env.PAYMENTS_API_URL ?? `http://127.0.0.1:${process.env.ROUNDMARK_PAY_PORT ?? '12111'}`;
export const PAY_KEY = process.env.PAYMENTS_SECRET_KEY ?? 'sk_test_roundmark_local_only';
export const WEBHOOK_SECRET = process.env.PAYMENTS_WEBHOOK_SECRET ?? 'whsec_roundmark_local_only';

// The card numbers payment providers publish for tests: one succeeds, one is declined.
export const CARD_OK = '4242 4242 4242 4242';
export const CARD_DECLINED = '4000 0000 0000 0002';

/** The SDK pointed at the fake; with an account, every call acts on that connected account. */
export function testStripe(account?: string | null): Stripe {
  const u = new URL(PAY_URL);
  return new Stripe(PAY_KEY, { host: u.hostname, port: Number(u.port), protocol: u.protocol === 'https:' ? 'https' : 'http', ...(account ? { stripeAccount: account } : {}) });
}

/**
 * Makes sure the fake sends its webhooks to the app under test, registered like the two real
 * endpoints: one for the platform's own events, one (connect) for connected accounts' events.
 */
export async function registerWebhook(_stripe?: Stripe): Promise<void> {
  const platform = testStripe();
  const url = `${BASE()}/api/payments/webhook`;
  const existing = await platform.webhookEndpoints.list({ limit: 100 });
  for (const connect of [false, true]) {
    if (!existing.data.some((w) => w.url === url && !!(w as { connect?: boolean }).connect === connect)) {
      await platform.webhookEndpoints.create({ url, enabled_events: ['*'], connect });
    }
  }
}

async function control(path: string, body?: Record<string, unknown>) {
  const res = await fetch(PAY_URL + path, {
    method: body ? 'POST' : 'GET',
    headers: { authorization: `Bearer ${PAY_KEY}`, 'content-type': 'application/json' },
    ...(body ? { body: JSON.stringify(body) } : {}),
  });
  const json = await res.json();
  if (!res.ok) throw new Error(`${path}: ${res.status} ${JSON.stringify(json)}`);
  return json;
}

/** Moves one subscription's clock: end_trial, renew (to the period end), fail_payment, pay. */
export const advance = (subscription: string, action: 'end_trial' | 'renew' | 'fail_payment' | 'pay') =>
  control('/_control/advance', { subscription, action });
/** The SDK acting on the connected account an object at the fake lives on (the platform's own if none). */
export async function stripeFor(objectId: string): Promise<Stripe> {
  const { account } = (await control(`/_control/objects/${encodeURIComponent(objectId)}/account`)) as { account: string | null };
  return testStripe(account);
}

/** Finishes (or leaves unfinished) a connected account's onboarding without the page. */
export const onboard = (account: string, outcome: 'complete' | 'incomplete' | 'restricted') =>
  control(`/_control/accounts/${encodeURIComponent(account)}/onboarding`, { outcome });

/** Holds new webhooks back (hold: true) or releases them, optionally newest first. */
export const holdWebhooks = (hold: boolean, order?: 'reverse') => control('/_control/webhooks', { hold, ...(order ? { order } : {}) });

/** Submits the fake's hosted card page; answers the redirect target or the page's HTML. */
export async function payOnPage(url: string, card: string, email = 'payer@test.example') {
  const res = await fetch(url, {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded' },
    body: new URLSearchParams({ email, card, expiry: '12/40', cvc: '123', name: 'Test Payer' }),
  });
  return { status: res.status, location: res.headers.get('location'), html: await res.text() };
}

export interface Membership {
  status: string;
  trialEnd: string | null;
  currentPeriodEnd: string | null;
  cancelAtPeriodEnd: boolean;
  promoCode: string | null;
  entitled: boolean;
}

export async function membership(member: ApiClient): Promise<Membership> {
  const res = await member.get('/api/billing/membership');
  if (res.status !== 200) throw new Error(`membership: ${res.status} ${await res.text()}`);
  return res.json();
}

/** Polls until the member's membership matches (webhooks arrive asynchronously). */
export async function waitForMembership(member: ApiClient, ok: (m: Membership) => boolean, what: string, ms = 20_000): Promise<Membership> {
  const deadline = Date.now() + ms;
  let last: Membership | undefined;
  while (Date.now() < deadline) {
    last = await membership(member);
    if (ok(last)) return last;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`membership never became ${what}; last seen ${JSON.stringify(last)}`);
}

/** A new member (signed up through the API) with a session. */
export async function newMember(label: string): Promise<{ client: ApiClient; email: string }> {
  const client = new ApiClient();
  const email = `${label}-${Date.now()}-${Math.floor(Math.random() * 1e6)}@test.example`;
  await client.signUpAndIn({ name: `Test ${label}`, email, password: 'a long enough password' });
  return { client, email };
}

/** Starts checkout through the app and pays with the succeeding card; answers the subscription id. */
export async function subscribe(member: ApiClient, promoCode?: string): Promise<string> {
  const res = await member.post('/api/billing/checkout', promoCode ? { promoCode } : {});
  if (res.status !== 200) throw new Error(`checkout: ${res.status} ${await res.text()}`);
  const { url } = await res.json();
  const paid = await payOnPage(url, CARD_OK);
  if (paid.status !== 303) throw new Error(`payment page answered ${paid.status}`);
  const sessionId = new URL(url).pathname.split('/').pop()!;
  const session = await (await stripeFor(sessionId)).checkout.sessions.retrieve(sessionId);
  return session.subscription as string;
}
