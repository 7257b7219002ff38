/**
 * The payments service down (the local fake stopped): a checkout answers 503 and says to try
 * again; a webhook that arrives meanwhile is refused with 503 (so the provider sends it again,
 * as its documentation says it does for any non-2xx answer) and stores nothing; replayed after
 * the service is back, it is applied once and its repeat is recognised as a duplicate.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { createDb } from '~/server/db';
import { webhookEvents } from '~/db/schema';
import type { ApiClient } from '../helpers/api-client';
import { newMember, registerWebhook, stripeFor, subscribe, testStripe, waitForMembership, WEBHOOK_SECRET } from '../helpers/payments';
import { startServices, stopService } from '../helpers/local-services';

// Bound to the demo studio's connected account once the subscription exists there.
let stripe = testStripe();
let account: string | null = null;
const { db, pool } = createDb(process.env.DATABASE_URL!);
let subscriber: ApiClient;
let newcomer: ApiClient;
let subId: string;

beforeAll(async () => {
  await registerWebhook(stripe);
  ({ client: subscriber } = await newMember('payments-down'));
  ({ client: newcomer } = await newMember('payments-down-new'));
  subId = await subscribe(subscriber);
  stripe = await stripeFor(subId);
  account = stripe.getApiField('stripeAccount') ?? null;
  await waitForMembership(subscriber, (m) => m.status === 'trialing', 'trialing');
});
afterAll(async () => {
  await startServices();
  await pool.end();
});

const signed = (payload: string) => stripe.webhooks.generateTestHeaderString({ payload, secret: WEBHOOK_SECRET });
const postEvent = (client: ApiClient, payload: string) =>
  client.request('POST', '/api/payments/webhook', payload, { 'content-type': 'application/json', 'stripe-signature': signed(payload) });

describe('payments service down', () => {
  it('checkout says to try again, a webhook is refused for a retry, and its replay is applied once', async () => {
    const sub = await stripe.subscriptions.retrieve(subId);
    const event = { id: `evt_outage_${Date.now()}`, object: 'event', account, type: 'customer.subscription.updated', created: Math.floor(Date.now() / 1000), data: { object: sub } };
    const payload = JSON.stringify(event);
    try {
      await stopService('payments');
      const started = Date.now();
      const checkout = await newcomer.post('/api/billing/checkout', {});
      expect(checkout.status).toBe(503);
      expect((await checkout.json()).error.message).toMatch(/Payments cannot be reached right now.*try again/);
      expect(Date.now() - started).toBeLessThan(10_000);

      const during = await postEvent(subscriber, payload);
      expect(during.status).toBe(503);
      await during.arrayBuffer();
      expect(await db.select().from(webhookEvents).where(eq(webhookEvents.id, event.id))).toEqual([]);
    } finally {
      await startServices();
    }

    const first = await postEvent(subscriber, payload);
    expect(first.status).toBe(200);
    expect(await first.json()).toMatchObject({ received: true, applied: true });
    const again = await postEvent(subscriber, payload);
    expect(again.status).toBe(200);
    expect(await again.json()).toMatchObject({ received: true, applied: false, reason: 'duplicate' });
    expect(await db.select().from(webhookEvents).where(eq(webhookEvents.id, event.id))).toHaveLength(1);
    await waitForMembership(subscriber, (m) => m.status === 'trialing', 'still trialing');
    // And checkout works again once the service is back.
    const checkout = await newcomer.post('/api/billing/checkout', {});
    expect(checkout.status).toBe(200);
    expect((await checkout.json()).url).toMatch(/^http/);
  });
});
