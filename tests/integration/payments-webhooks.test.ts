/**
 * Webhooks from the payment provider (the local fake, reached by the official SDK): signature
 * checked with the SDK's scheme, each event applied once, late events never undo newer ones.
 * Sources: the SDK's webhook signing (t=…,v1=HMAC-SHA256 of "t.payload"), the provider's advice
 * that events may be repeated and may arrive out of order.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { createDb } from '~/server/db';
import { studios, subscriptions, users, webhookEvents } from '~/db/schema';
import type { ApiClient } from '../helpers/api-client';
import { advance, holdWebhooks, membership, newMember, registerWebhook, stripeFor, subscribe, testStripe, waitForMembership, WEBHOOK_SECRET } from '../helpers/payments';

// Bound to the demo studio's connected account once the first subscription exists there.
let stripe = testStripe();
const { db, pool } = createDb(process.env.DATABASE_URL!);
let member: ApiClient;
let subId: string;

const postEvent = (client: ApiClient, payload: string, signature?: string) =>
  client.request('POST', '/api/payments/webhook', payload, { 'content-type': 'application/json', ...(signature ? { 'stripe-signature': signature } : {}) });

/** The events the fake made for one subscription since a moment, oldest first. */
async function eventsFor(sub: string, types: string[]) {
  const list = await stripe.events.list({ limit: 100 });
  return list.data
    .filter((e) => types.includes(e.type) && ((e.data.object as { id?: string }).id === sub || (e.data.object as { parent?: { subscription_details?: { subscription?: string } } }).parent?.subscription_details?.subscription === sub))
    .reverse();
}

beforeAll(async () => {
  await registerWebhook(stripe);
  ({ client: member } = await newMember('webhooks'));
  subId = await subscribe(member);
  stripe = await stripeFor(subId);
  await waitForMembership(member, (m) => m.status === 'trialing', 'trialing');
});
afterAll(async () => {
  await holdWebhooks(false);
  await pool.end();
});

describe('POST /api/payments/webhook', () => {
  it('rejects a forged signature (400) and changes nothing', async () => {
    const before = await membership(member);
    const sub = await stripe.subscriptions.retrieve(subId);
    const forged = { id: `evt_forged_${Date.now()}`, object: 'event', type: 'customer.subscription.deleted', created: Math.floor(Date.now() / 1000) + 3600, data: { object: { ...sub, status: 'canceled' } } };
    const payload = JSON.stringify(forged);
    const wrongSecret = stripe.webhooks.generateTestHeaderString({ payload, secret: 'whsec_not_the_right_one' });
    const res = await postEvent(member, payload, wrongSecret);
    expect(res.status).toBe(400);
    expect((await res.json()).error.message).toMatch(/signature/);
    // No header at all, and a correct signature over a different body, are refused the same way.
    expect((await postEvent(member, payload)).status).toBe(400);
    const signedOther = stripe.webhooks.generateTestHeaderString({ payload: payload.replace('canceled', 'active'), secret: WEBHOOK_SECRET });
    expect((await postEvent(member, payload, signedOther)).status).toBe(400);
    // A signature older than the SDK's 5-minute tolerance is a replay.
    const old = stripe.webhooks.generateTestHeaderString({ payload, secret: WEBHOOK_SECRET, timestamp: Math.floor(Date.now() / 1000) - 600 });
    expect((await postEvent(member, payload, old)).status).toBe(400);

    expect(await membership(member)).toEqual(before);
    expect(await db.select().from(webhookEvents).where(eq(webhookEvents.id, forged.id))).toEqual([]);
  });

  it('refuses a signature dated beyond the tolerance in the future as well as in the past', async () => {
    const before = await membership(member);
    const sub = await stripe.subscriptions.retrieve(subId);
    const event = { id: `evt_future_${Date.now()}`, object: 'event', type: 'customer.subscription.updated', created: Math.floor(Date.now() / 1000), data: { object: { ...sub, status: 'canceled' } } };
    const payload = JSON.stringify(event);
    const ahead = stripe.webhooks.generateTestHeaderString({ payload, secret: WEBHOOK_SECRET, timestamp: Math.floor(Date.now() / 1000) + 3600 });
    const res = await postEvent(member, payload, ahead);
    expect(res.status).toBe(400);
    expect((await res.json()).error.message).toMatch(/dated in the future/);
    expect(await membership(member)).toEqual(before);
    expect(await db.select().from(webhookEvents).where(eq(webhookEvents.id, event.id))).toEqual([]);
  });

  it('never creates a subscription for someone who is not a member of that studio', async () => {
    // Someone with an account but no membership in this studio.
    const strangerId = `stranger-${Date.now()}`;
    await db.insert(users).values({ id: strangerId, email: `${strangerId}@test.example`, name: 'Stranger', passwordHash: 'not used' });
    const [fernhill] = await db.select().from(studios).where(eq(studios.slug, 'fernhill'));
    const sub = await stripe.subscriptions.retrieve(subId);
    const stranger = { ...sub, id: `sub_stranger_${Date.now()}`, status: 'active', metadata: { studioId: fernhill!.id, userId: strangerId } };
    const event = { id: `evt_stranger_${Date.now()}`, object: 'event', type: 'customer.subscription.created', created: Math.floor(Date.now() / 1000), data: { object: stranger } };
    const payload = JSON.stringify(event);
    const res = await postEvent(member, payload, stripe.webhooks.generateTestHeaderString({ payload, secret: WEBHOOK_SECRET }));
    expect(res.status).toBe(200);
    expect(await res.json()).toMatchObject({ applied: false, reason: 'not a member of that studio' });
    expect(await db.select().from(subscriptions).where(and(eq(subscriptions.userId, strangerId), eq(subscriptions.studioId, fernhill!.id)))).toEqual([]);
  });

  it('applies the same event once, however often it arrives', async () => {
    await holdWebhooks(true);
    await advance(subId, 'end_trial');
    const [updated] = (await eventsFor(subId, ['customer.subscription.updated'])).slice(-1);
    expect((updated!.data.object as { status: string }).status).toBe('active');
    const payload = JSON.stringify(updated);
    const sign = () => stripe.webhooks.generateTestHeaderString({ payload, secret: WEBHOOK_SECRET });
    const first = await (await postEvent(member, payload, sign())).json();
    const second = await (await postEvent(member, payload, sign())).json();
    expect(first).toMatchObject({ received: true, applied: true });
    expect(second).toMatchObject({ received: true, applied: false, reason: 'duplicate' });
    expect(await db.select().from(webhookEvents).where(eq(webhookEvents.id, updated!.id))).toHaveLength(1);
    expect((await membership(member)).status).toBe('active');
    // The fake's own deliveries of the held events now arrive as repeats and change nothing.
    await holdWebhooks(false);
    await new Promise((r) => setTimeout(r, 1000));
    expect(await db.select().from(webhookEvents).where(eq(webhookEvents.id, updated!.id))).toHaveLength(1);
    expect((await membership(member)).status).toBe('active');
  });

  it('ends in the right state when events arrive newest first', async () => {
    await holdWebhooks(true);
    // Three changes at the provider: renewed (active), set to cancel at period end, then ended.
    await advance(subId, 'renew');
    await stripe.subscriptions.update(subId, { cancel_at_period_end: true });
    await advance(subId, 'renew');
    const sub = await stripe.subscriptions.retrieve(subId);
    expect(sub.status).toBe('canceled');
    const held = await eventsFor(subId, ['customer.subscription.updated', 'customer.subscription.deleted']);
    expect(held.at(-1)!.type).toBe('customer.subscription.deleted');
    // Newest first: the deletion lands, then the older updates, which must not revive it.
    await holdWebhooks(false, 'reverse');
    const m = await waitForMembership(member, (x) => x.status === 'canceled', 'canceled');
    await new Promise((r) => setTimeout(r, 1500)); // let the older events arrive too
    expect(await membership(member)).toEqual(m);
    expect(m).toMatchObject({ status: 'canceled', entitled: false, cancelAtPeriodEnd: false });
  });
});

describe('event order', () => {
  it('ends in the provider’s state when two events of the same second arrive reversed', async () => {
    // A member of its own, so the other tests' subscription keeps its trial.
    const { client: payer } = await newMember('same-second');
    const sub2 = await subscribe(payer);
    await waitForMembership(payer, (m) => m.status === 'trialing', 'trialing');
    await advance(sub2, 'end_trial');
    await waitForMembership(payer, (m) => m.status === 'active', 'active');
    await holdWebhooks(true);
    await advance(sub2, 'fail_payment'); // past_due
    await advance(sub2, 'pay'); // active again
    expect((await stripe.subscriptions.retrieve(sub2)).status).toBe('active');
    const held = (await eventsFor(sub2, ['customer.subscription.updated'])).slice(-2);
    expect(held.map((e) => (e.data.object as { status: string }).status)).toEqual(['past_due', 'active']);
    // Both stamped with the same second, as happens when the provider sends them back to back;
    // delivered newest first. Ordering by the event's time cannot tell them apart.
    const second = held[1]!.created;
    for (const e of [held[1]!, held[0]!]) {
      const payload = JSON.stringify({ ...e, created: second });
      const res = await postEvent(payer, payload, stripe.webhooks.generateTestHeaderString({ payload, secret: WEBHOOK_SECRET }));
      expect(res.status).toBe(200);
    }
    expect((await membership(payer)).status).toBe('active');
    await holdWebhooks(false);
  });
});
