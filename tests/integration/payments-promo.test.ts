/**
 * Promo codes: percent off the first paid invoice only (the coupon's duration "once"), and
 * expired, deactivated or unknown codes refused with a message before any payment page opens.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { DEMO, signedIn, type ApiClient } from '../helpers/api-client';
import { advance, membership, newMember, registerWebhook, subscribe, testStripe, waitForMembership } from '../helpers/payments';

// Bound to the demo studio's connected account in beforeAll: its codes live there.
let stripe = testStripe();
let owner: ApiClient;
const unique = () => `T${Date.now().toString(36).toUpperCase()}${Math.floor(Math.random() * 1296).toString(36).toUpperCase()}`;

beforeAll(async () => {
  await registerWebhook(stripe);
  owner = await signedIn(DEMO.owner);
  stripe = testStripe((await (await owner.get('/api/billing/payments')).json()).accountId);
});

async function createCode(body: object) {
  const res = await owner.post('/api/billing/promo-codes', body);
  expect(res.status, await res.clone().text()).toBe(201);
  return res.json();
}

describe('promo codes', () => {
  it('takes the percentage off the first invoice that charges, and only that one', async () => {
    const settings = await (await owner.get('/api/billing/settings')).json();
    const price = settings.monthlyPriceMinor as number;
    const code = await createCode({ code: unique(), percentOff: 30 });
    const { client: member } = await newMember('promo');
    const subId = await subscribe(member, code.code.toLowerCase()); // codes are typed in any case
    const m = await waitForMembership(member, (x) => x.status === 'trialing', 'trialing');
    expect(m.promoCode).toBe(code.code);

    await advance(subId, 'end_trial');
    await advance(subId, 'renew');
    const invoices = (await stripe.invoices.list({ subscription: subId })).data.reverse();
    expect(invoices.map((i) => [i.billing_reason, i.subtotal, i.total, i.status])).toEqual([
      ['subscription_create', 0, 0, 'paid'], // the trial
      ['subscription_cycle', price, price - Math.round(price * 0.3), 'paid'], // first month, 30 % off
      ['subscription_cycle', price, price, 'paid'], // second month, full price
    ]);
    const listed = (await (await owner.get('/api/billing/promo-codes')).json()).promoCodes.find((p: { id: string }) => p.id === code.id);
    expect(listed).toMatchObject({ redemptions: 1, state: 'active' });
  });

  it('refuses an expired code with a clear message and opens no payment page', async () => {
    const code = await createCode({ code: unique(), percentOff: 10, expiresAt: new Date(Date.now() + 1500).toISOString() });
    await new Promise((r) => setTimeout(r, 2000));
    const { client: member } = await newMember('expired');
    const res = await member.post('/api/billing/checkout', { promoCode: code.code });
    expect(res.status).toBe(400);
    const { error } = await res.json();
    expect(error.fields.promoCode).toMatch(new RegExp(`The code ${code.code} expired on`));
    expect((await membership(member)).status).toBe('none');
    // The provider itself refuses it too (checked against its own copy of the code).
    const promo = (await stripe.promotionCodes.list({ code: code.code })).data[0]!;
    expect(promo.expires_at).not.toBeNull();
  });

  it('refuses a deactivated code, and an unknown one', async () => {
    const code = await createCode({ code: unique(), percentOff: 15 });
    const off = await owner.patch(`/api/billing/promo-codes/${code.id}`, { active: false });
    expect(await off.json()).toMatchObject({ active: false, state: 'inactive' });
    expect((await stripe.promotionCodes.retrieve((await stripe.promotionCodes.list({ code: code.code })).data[0]!.id)).active).toBe(false);
    const { client: member } = await newMember('inactive');
    const res = await member.post('/api/billing/checkout', { promoCode: code.code });
    expect(res.status).toBe(400);
    expect((await res.json()).error.fields.promoCode).toBe(`The code ${code.code} is no longer active. Leave the field empty to start without it.`);
    const unknown = await member.post('/api/billing/checkout', { promoCode: 'NO-SUCH-CODE' });
    expect((await unknown.json()).error.fields.promoCode).toMatch(/We don't recognise the code NO-SUCH-CODE/);
    // Without a code the same member goes straight to the payment page.
    const ok = await member.post('/api/billing/checkout', {});
    expect(ok.status).toBe(200);
    expect((await ok.json()).url).toMatch(/\/pay\/cs_test_/);
  });

  it('is for the owner only', async () => {
    const member = await signedIn(DEMO.member);
    expect((await member.get('/api/billing/promo-codes')).status).toBe(403);
    expect((await (await signedIn(DEMO.coach)).post('/api/billing/promo-codes', { code: unique(), percentOff: 5 })).status).toBe(403);
  });
});
