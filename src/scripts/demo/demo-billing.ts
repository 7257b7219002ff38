import { and, eq } from 'drizzle-orm';
import type Stripe from 'stripe';
import { billingSettings, paymentAccounts, promoCodes, subscriptions } from '~/db/schema';
import type { AppDeps } from '~/server/app';
import { env } from '~/server/env';
import type { BillingDeps } from '~/server/payments/billing-deps';
import { stripe } from '~/server/payments/stripe-client';
import { createPromoCode, ensurePrice } from '~/server/services/billing';
import { ensurePaymentAccount, onAccount, storeAccountState } from '~/server/services/payment-accounts';

/** Demo memberships (invented): Sam active, Lee on trial with the welcome code, Noor cancelled. */
export const DEMO_MEMBERSHIPS = [
  { email: 'sam@fernhill.example', state: 'active' },
  { email: 'lee@fernhill.example', state: 'trialing', promo: 'FERNHILL20' },
  { email: 'noor@fernhill.example', state: 'canceled' },
] as const;

/**
 * Adds what is missing of the studio's offer (EUR 19.00 a month, 14-day trial, FERNHILL20 for
 * 20 % off the first month) and the demo members' subscriptions. The subscriptions are created
 * at the payment provider (the local fake) through the SDK and their state is written straight
 * into our table, so the demo is right before any webhook arrives; later webhooks agree with it.
 */
export async function seedBilling(deps: AppDeps, studioId: string, userIds: Map<string, string>, names: Map<string, string>): Promise<string> {
  await deps.db.insert(billingSettings).values({ studioId, currency: 'eur', monthlyPriceMinor: 1900, trialDays: 14, pastDueGraceDays: 3 }).onConflictDoNothing();
  const b = { ...deps, stripe: stripe() };
  let settings;
  let on;
  try {
    on = onAccount(await connectDemoAccount(b, studioId));
    settings = await ensurePrice(b, studioId, { verify: true });
  } catch (err) {
    return `payments not reachable (${(err as Error).message}); demo memberships not created. Start the services and run the seed again.`;
  }
  let promo = await deps.db.query.promoCodes.findFirst({ where: and(eq(promoCodes.studioId, studioId), eq(promoCodes.code, 'FERNHILL20')) });
  if (!promo) {
    // One provider account can outlive a database (the local fake serves every local database):
    // a matching active code already there is adopted instead of created twice.
    const [there] = (await b.stripe.promotionCodes.list({ code: 'FERNHILL20', active: true, limit: 1, expand: ['data.promotion.coupon'] }, on)).data;
    const coupon = there?.promotion.coupon;
    if (there && coupon && typeof coupon !== 'string' && coupon.percent_off === 20 && coupon.duration === 'once') {
      await deps.db
        .insert(promoCodes)
        .values({ studioId, code: 'FERNHILL20', percentOff: 20, providerCouponId: coupon.id, providerPromotionCodeId: there.id, providerAccountId: on?.stripeAccount ?? null })
        .onConflictDoNothing();
    } else {
      await createPromoCode(b, studioId, { code: 'FERNHILL20', percentOff: 20, expiresAt: null });
    }
    promo = await deps.db.query.promoCodes.findFirst({ where: and(eq(promoCodes.studioId, studioId), eq(promoCodes.code, 'FERNHILL20')) });
  }
  let added = 0;
  for (const d of DEMO_MEMBERSHIPS) {
    const userId = userIds.get(d.email);
    if (!userId) continue;
    const existing = await deps.db.query.subscriptions.findFirst({ where: and(eq(subscriptions.studioId, studioId), eq(subscriptions.userId, userId)) });
    if (existing?.providerSubscriptionId) continue;
    const customer = await b.stripe.customers.create({ email: d.email, name: names.get(d.email) ?? d.email, metadata: { userId, studioId } }, on);
    const usePromo = 'promo' in d && promo?.providerPromotionCodeId ? promo : null;
    let sub: Stripe.Subscription = await b.stripe.subscriptions.create({
      customer: customer.id,
      items: [{ price: settings.providerPriceId! }],
      ...(d.state === 'trialing' ? { trial_period_days: settings.trialDays } : {}),
      ...(usePromo ? { discounts: [{ promotion_code: usePromo.providerPromotionCodeId! }] } : {}),
      application_fee_percent: env().PLATFORM_FEE_PERCENT,
      metadata: { studioId, userId, ...(usePromo ? { promoCode: usePromo.code } : {}) },
    }, on);
    if (d.state === 'canceled') sub = await b.stripe.subscriptions.cancel(sub.id, {}, on);
    const periodEnd = sub.status === 'trialing' ? sub.trial_end : sub.items.data[0]?.current_period_end;
    const values = {
      providerCustomerId: customer.id,
      providerSubscriptionId: sub.id,
      providerAccountId: on?.stripeAccount ?? null,
      status: sub.status as 'active' | 'trialing' | 'canceled',
      trialEnd: sub.trial_end ? new Date(sub.trial_end * 1000) : null,
      currentPeriodEnd: periodEnd ? new Date(periodEnd * 1000) : null,
      cancelAtPeriodEnd: false,
      promoCode: usePromo?.code ?? null,
      lastEventAt: new Date(sub.created * 1000),
    };
    if (existing) await deps.db.update(subscriptions).set(values).where(eq(subscriptions.id, existing.id));
    else await deps.db.insert(subscriptions).values({ studioId, userId, ...values });
    added++;
  }
  return `memberships ready (${added} added)`;
}

/**
 * The demo studio's connected account, ready to take payments: made at the local fake and its
 * onboarding completed through the fake's test control (a person does it on the fake's page).
 * A stored account the fake no longer knows (its data was reset) is replaced.
 */
async function connectDemoAccount(b: BillingDeps, studioId: string): Promise<string> {
  const stored = await b.db.query.paymentAccounts.findFirst({ where: eq(paymentAccounts.studioId, studioId) });
  if (stored) {
    const alive = await b.stripe.accounts.retrieve(stored.providerAccountId).then(() => true, () => false);
    if (!alive) {
      await b.db.delete(paymentAccounts).where(eq(paymentAccounts.studioId, studioId));
      await b.db.update(subscriptions).set({ providerAccountId: null }).where(eq(subscriptions.studioId, studioId));
    }
  }
  const row = await ensurePaymentAccount(b, studioId, { email: 'ada@fernhill.example' });
  if (!row.chargesEnabled) {
    const res = await fetch(`${env().PAYMENTS_API_URL}/_control/accounts/${row.providerAccountId}/onboarding`, {
      method: 'POST',
      headers: { authorization: `Bearer ${env().PAYMENTS_SECRET_KEY}`, 'content-type': 'application/json' },
      body: JSON.stringify({ outcome: 'complete' }),
    });
    if (!res.ok) throw new Error(`the payments fake did not complete the demo account's onboarding (${res.status})`);
    await storeAccountState(b, await b.stripe.accounts.retrieve(row.providerAccountId));
  }
  return row.providerAccountId;
}
