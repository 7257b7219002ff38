/**
 * Webhooks from the payment provider (the local fake, reached by the official SDK): signature
 * checked with the SDK's scheme, each event applied once, late events never undo newer ones.
 * Sources: the SDK's webhook signing (t=…,v1=HMAC-SHA256 of "t.payload"), the provider's advice
 * that events may be repeated and may arrive out of order.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { createDb } from '~/server/db';
import { webhookEvents } from '~/db/schema';
import type { ApiClient } from '../helpers/api-client';
import { advance, holdWebhooks, membership, newMember, registerWebhook, subscribe, testStripe, waitForMembership, WEBHOOK_SECRET } from '../helpers/payments';

const stripe = testStripe();
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
