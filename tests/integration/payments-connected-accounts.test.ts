// Each studio sells on its own connected account at the payment provider (the local fake, reached
// by the official SDK): onboarding through the fake's page, prices, customers and checkouts on the
// studio's account with the platform's application fee, and webhooks routed by the account they
// name: two studios' events interleaved, each applied to its own studio, once; an unknown account
// acknowledged and not written. Studios, people and bank details here are invented for the test.
// Sources: the SDK's Stripe-Account request option and the events' `account` field (connected
// accounts' events), the provider's advice that events repeat and arrive out of order.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq, inArray } from 'drizzle-orm';
import { createAppDeps } from '~/server/app';
import { memberships, paymentAccounts, subscriptions, users, webhookEvents } from '~/db/schema';
import { NOT_SELLING_MESSAGE } from '~/lib/billing/payment-account-state';
import { ApiClient } from '../helpers/api-client';
import { advance, holdWebhooks, membership, onboard, registerWebhook, stripeFor, subscribe, testStripe, waitForMembership, WEBHOOK_SECRET } from '../helpers/payments';

const deps = createAppDeps(process.env.DATABASE_URL!);
const run = `${Date.now().toString(36)}${Math.floor(Math.random() * 1e4).toString(36)}`;
// The example IBAN published with ISO 13616 explanations (secondary; its check digits are verified by the fake's mod-97 rule).
const TEST_IBAN = 'DE89 3704 0044 0532 0130 00';

interface Studio {
  id: string;
  owner: ApiClient;
  member: ApiClient;
  memberId: string;
}

async function person(label: string): Promise<{ client: ApiClient; id: string }> {
  const client = new ApiClient();
  const email = `${label}-${run}@connect.example`;
  await client.signUpAndIn({ name: `Person ${label}`, email, password: 'a long enough password' });
  const [user] = await deps.db.select().from(users).where(eq(users.email, email));
  return { client, id: user!.id };
}

/** A studio started through the API, and a member of it (added as its join page would) working in it. */
async function newStudio(label: string): Promise<Studio> {
  const { client: owner } = await person(`${label}-owner`);
  const res = await owner.post('/api/studios', { name: `Studio ${label} ${run}`, slug: `${label}-${run}`, timeZone: 'Europe/Berlin', currency: 'eur', monthlyPriceMinor: 1500, trialDays: 7, accentColour: '#2E5E4E' });
  expect(res.status, await res.clone().text()).toBe(201);
  const { id } = await res.json();
  const { client: member, id: memberId } = await person(`${label}-member`);
  await deps.db.insert(memberships).values({ studioId: id, userId: memberId, role: 'member' });
  expect((await member.put('/api/me/studio', { studioId: id })).status).toBe(200);
  return { id, owner, member, memberId };
}

/** The owner's "Connect payments", then the fake's onboarding page filled in as a person would. */
async function connect(owner: ApiClient, form: Record<string, string>) {
  const res = await owner.post('/api/billing/payments/onboarding', {});
  expect(res.status, await res.clone().text()).toBe(200);
  const { url } = await res.json();
  const page = await fetch(url);
  expect(page.status).toBe(200);
  expect(await page.text()).toMatch(/Set up payouts/);
  const done = await fetch(url, { method: 'POST', redirect: 'manual', headers: { 'content-type': 'application/x-www-form-urlencoded' }, body: new URLSearchParams(form) });
  return { url, status: done.status, location: done.headers.get('location'), html: done.status === 303 ? '' : await done.text() };
}

const payments = async (owner: ApiClient) => {
  const res = await owner.get('/api/billing/payments');
  expect(res.status).toBe(200);
  return res.json();
};

let a: Studio;
let b: Studio;

beforeAll(async () => {
  await registerWebhook();
  [a, b] = await Promise.all([newStudio('north'), newStudio('south')]);
});
afterAll(async () => {
  await holdWebhooks(false);
  await deps.pool.end();
});

describe('a studio that has not connected payments', () => {
  it('can be seen but not bought: checkout says so plainly and nothing reaches the provider', async () => {
    expect(await payments(a.owner)).toMatchObject({ state: 'none', accountId: null, chargesEnabled: false });
    const res = await a.member.post('/api/billing/checkout', {});
    expect(res.status).toBe(409);
    expect((await res.json()).error.message).toBe(NOT_SELLING_MESSAGE);
    expect(await deps.db.select().from(subscriptions).where(eq(subscriptions.studioId, a.id))).toEqual([]);
    // The member's account page says the same instead of offering a membership.
    const accountPage = await (await a.member.get('/account')).text();
    expect(accountPage).toContain(NOT_SELLING_MESSAGE);
    expect(accountPage).not.toContain('Start your free trial');
    // The owner can still set the price and make promo codes; they wait until the account is ready.
    const settings = await (await a.owner.get('/api/billing/settings')).json();
    expect((await a.owner.put('/api/billing/settings', { monthlyPriceMinor: 1600, trialDays: 7, pastDueGraceDays: 3, version: settings.version })).status).toBe(200);
    expect((await a.owner.post('/api/billing/promo-codes', { code: `NORTH${run}`.slice(0, 24).toUpperCase(), percentOff: 25 })).status).toBe(201);
  });

  it('other roles cannot see or start the payment setup', async () => {
    expect((await a.member.get('/api/billing/payments')).status).toBe(403);
    expect((await a.member.post('/api/billing/payments/onboarding', {})).status).toBe(403);
    expect((await new ApiClient().post('/api/billing/payments/onboarding', {})).status).toBe(401);
  });
});

describe('onboarding on the fake’s page', () => {
  it('keeps the account not ready when the owner leaves early, refuses a wrong IBAN, then is ready', async () => {
    const later = await connect(a.owner, { intent: 'later', businessName: 'North' });
    expect(later.status).toBe(303);
    expect(later.location).toMatch(/\/studio\/billing\?payments=returned#payments$/);
    expect(await payments(a.owner)).toMatchObject({ state: 'onboarding', chargesEnabled: false, payoutsEnabled: false });
    // A used link sends the owner to the app's refresh address for a new one.
    const again = await fetch(later.url, { redirect: 'manual' });
    expect(again.status).toBe(303);
    expect(again.headers.get('location')).toMatch(/\/studio\/billing\/payments-link$/);

    const wrong = await connect(a.owner, { intent: 'submit', businessName: 'North', iban: 'DE00 3704 0044 0532 0130 00', terms: 'yes' });
    expect(wrong.status).toBe(400);
    expect(wrong.html).toMatch(/That IBAN is not valid/);
    expect(await payments(a.owner)).toMatchObject({ state: 'onboarding' });

    const ok = await connect(a.owner, { intent: 'submit', businessName: 'North', iban: TEST_IBAN, terms: 'yes' });
    expect(ok.status).toBe(303);
    const view = await payments(a.owner);
    expect(view).toMatchObject({ state: 'ready', chargesEnabled: true, payoutsEnabled: true, requirementsDue: 0 });
    expect(view.accountId).toMatch(/^acct_/);
    // One account per studio however often the owner connects.
    expect(await deps.db.select().from(paymentAccounts).where(eq(paymentAccounts.studioId, a.id))).toHaveLength(1);
  });

  it('a restricted account (details in, something still due) cannot sell either', async () => {
    await connect(b.owner, { intent: 'later' });
    const { accountId } = await payments(b.owner);
    await onboard(accountId, 'restricted');
    expect(await payments(b.owner)).toMatchObject({ state: 'restricted', chargesEnabled: false, detailsSubmitted: true });
    const res = await b.member.post('/api/billing/checkout', {});
    expect(res.status).toBe(409);
    await onboard(accountId, 'complete');
    expect(await payments(b.owner)).toMatchObject({ state: 'ready' });
  });
});

describe('selling on the studio’s own account', () => {
  let subA = '';
  let subB = '';
  let accountA = '';
  let accountB = '';
  let fee = 0;

  beforeAll(async () => {
    ({ accountId: accountA, feePercent: fee } = await payments(a.owner));
    ({ accountId: accountB } = await payments(b.owner));
    subA = await subscribe(a.member, `NORTH${run}`.slice(0, 24).toLowerCase());
    subB = await subscribe(b.member);
    await waitForMembership(a.member, (m) => m.status === 'trialing', 'trialing at north');
    await waitForMembership(b.member, (m) => m.status === 'trialing', 'trialing at south');
  });

  it('puts each checkout, customer and price on that studio’s account, with the platform fee', async () => {
    const onA = testStripe(accountA);
    const onB = testStripe(accountB);
    expect((await stripeFor(subA)).getApiField('stripeAccount')).toBe(accountA);
    expect((await stripeFor(subB)).getApiField('stripeAccount')).toBe(accountB);
    const sub = await onA.subscriptions.retrieve(subA);
    expect(sub.items.data[0]!.price.unit_amount).toBe(1600); // the price saved before the account was ready
    expect((sub as unknown as { application_fee_percent: number }).application_fee_percent).toBe(fee);
    // Another account, and the platform itself, cannot see it (direct charges live on the account).
    await expect(onB.subscriptions.retrieve(subA)).rejects.toMatchObject({ statusCode: 404 });
    await expect(testStripe().subscriptions.retrieve(subA)).rejects.toMatchObject({ statusCode: 404 });
    // The promo code made while the account was not ready was made on it at the first checkout.
    expect((await onA.promotionCodes.list({ code: `NORTH${run}`.slice(0, 24).toUpperCase() })).data).toHaveLength(1);
    const rows = await deps.db.select().from(subscriptions).where(inArray(subscriptions.providerSubscriptionId, [subA, subB]));
    expect(rows.map((r) => [r.providerSubscriptionId, r.studioId, r.providerAccountId]).sort()).toEqual(
      [[subA, a.id, accountA], [subB, b.id, accountB]].sort(),
    );
  });

  it('applies two studios’ interleaved webhooks each to its own studio, once', async () => {
    await holdWebhooks(true);
    await advance(subA, 'end_trial'); // north: first paid month (25 % off)
    await advance(subB, 'end_trial'); // south: first paid month
    await advance(subA, 'fail_payment'); // north: the next month's card is declined → past_due
    await testStripe(accountB).subscriptions.update(subB, { cancel_at_period_end: true }); // south: cancels at period end
    const events = [
      ...(await testStripe(accountA).events.list({ limit: 100 })).data.filter((e) => JSON.stringify(e.data.object).includes(subA)),
      ...(await testStripe(accountB).events.list({ limit: 100 })).data.filter((e) => JSON.stringify(e.data.object).includes(subB)),
    ];
    expect(events.every((e) => e.account === accountA || e.account === accountB)).toBe(true);
    // Released newest first (the two studios' events interleaved), then every one of them sent again.
    await holdWebhooks(false, 'reverse');
    const north = await waitForMembership(a.member, (m) => m.status === 'past_due', 'past_due at north');
    const south = await waitForMembership(b.member, (m) => m.status === 'active' && m.cancelAtPeriodEnd, 'active, cancelling at south');
    const ids = events.map((e) => e.id);
    const stored = async () => deps.db.select().from(webhookEvents).where(inArray(webhookEvents.id, ids));
    await expect.poll(async () => (await stored()).length, { timeout: 20_000 }).toBe(new Set(ids).size);
    for (const e of events) {
      const payload = JSON.stringify(e);
      const res = await a.member.request('POST', '/api/payments/webhook', payload, {
        'content-type': 'application/json',
        'stripe-signature': testStripe().webhooks.generateTestHeaderString({ payload, secret: WEBHOOK_SECRET }),
      });
      expect(await res.json()).toMatchObject({ received: true, applied: false, reason: 'duplicate' });
    }
    expect(await stored()).toHaveLength(new Set(ids).size);
    expect(await membership(a.member)).toEqual(north);
    expect(await membership(b.member)).toEqual(south);
    // Each studio's row was written by its own account's events only.
    const [rowA] = await deps.db.select().from(subscriptions).where(eq(subscriptions.providerSubscriptionId, subA));
    const [rowB] = await deps.db.select().from(subscriptions).where(eq(subscriptions.providerSubscriptionId, subB));
    expect([rowA!.studioId, rowA!.status, rowB!.studioId, rowB!.status]).toEqual([a.id, 'past_due', b.id, 'active']);
    // The platform's fee on the first paid month of each: its percentage of what was charged.
    for (const [account, sub] of [[accountA, subA], [accountB, subB]] as const) {
      const paid = (await testStripe(account).invoices.list({ subscription: sub })).data.find((i) => i.billing_reason === 'subscription_cycle' && i.status === 'paid')!;
      expect((paid as unknown as { application_fee_amount: number }).application_fee_amount).toBe(Math.round((paid.total * fee) / 100));
    }
  });

  it('acknowledges an event of an account no studio owns and writes nothing; an account cannot write another studio’s row', async () => {
    const before = await deps.db.select().from(subscriptions).where(eq(subscriptions.providerSubscriptionId, subA));
    const sub = await testStripe(accountA).subscriptions.retrieve(subA);
    const post = async (event: object) => {
      const payload = JSON.stringify(event);
      const res = await a.member.request('POST', '/api/payments/webhook', payload, {
        'content-type': 'application/json',
        'stripe-signature': testStripe().webhooks.generateTestHeaderString({ payload, secret: WEBHOOK_SECRET }),
      });
      expect(res.status).toBe(200);
      return res.json();
    };
    const stranger = await testStripe().accounts.create({ type: 'standard', metadata: { note: 'no studio here' } });
    const unknown = { id: `evt_unknown_${run}`, object: 'event', account: stranger.id, type: 'customer.subscription.updated', created: Math.floor(Date.now() / 1000), data: { object: { ...sub, status: 'canceled' } } };
    expect(await post(unknown)).toMatchObject({ applied: false, reason: 'unknown account' });
    const crossed = { ...unknown, id: `evt_crossed_${run}`, account: accountB };
    expect((await post(crossed)).applied).toBe(false);
    expect(await deps.db.select().from(webhookEvents).where(eq(webhookEvents.id, unknown.id))).toEqual([]);
    expect(await deps.db.select().from(subscriptions).where(eq(subscriptions.providerSubscriptionId, subA))).toEqual(before);
    // The stranger account's own onboarding event reaches the app too, and changes no studio.
    await onboard(stranger.id, 'complete');
    expect(await deps.db.select().from(paymentAccounts).where(eq(paymentAccounts.providerAccountId, stranger.id))).toEqual([]);
    expect(await deps.db.select().from(memberships).where(and(eq(memberships.studioId, a.id), eq(memberships.userId, a.memberId)))).toHaveLength(1);
  });
});
