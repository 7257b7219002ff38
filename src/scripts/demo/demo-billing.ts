import { and, eq } from 'drizzle-orm';
import type Stripe from 'stripe';
import { billingSettings, promoCodes, subscriptions } from '~/db/schema';
import type { AppDeps } from '~/server/app';
import { stripe } from '~/server/payments/stripe-client';
import { createPromoCode, ensurePrice } from '~/server/services/billing';

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
  try {
    settings = await ensurePrice(b, studioId, { verify: true });
  } catch (err) {
    return `payments not reachable (${(err as Error).message}); demo memberships not created. Start the services and run the seed again.`;
  }
  let promo = await deps.db.query.promoCodes.findFirst({ where: and(eq(promoCodes.studioId, studioId), eq(promoCodes.code, 'FERNHILL20')) });
  if (!promo) {
    // One provider account can outlive a database (the local fake serves every local database):
    // a matching active code already there is adopted instead of created twice.
    const [there] = (await b.stripe.promotionCodes.list({ code: 'FERNHILL20', active: true, limit: 1, expand: ['data.promotion.coupon'] })).data;
    const coupon = there?.promotion.coupon;
    if (there && coupon && typeof coupon !== 'string' && coupon.percent_off === 20 && coupon.duration === 'once') {
      await deps.db.insert(promoCodes).values({ studioId, code: 'FERNHILL20', percentOff: 20, providerCouponId: coupon.id, providerPromotionCodeId: there.id }).onConflictDoNothing();
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
    const customer = await b.stripe.customers.create({ email: d.email, name: names.get(d.email) ?? d.email, metadata: { userId, studioId } });
    const usePromo = 'promo' in d && promo?.providerPromotionCodeId ? promo : null;
    let sub: Stripe.Subscription = await b.stripe.subscriptions.create({
      customer: customer.id,
      items: [{ price: settings.providerPriceId! }],
      ...(d.state === 'trialing' ? { trial_period_days: settings.trialDays } : {}),
      ...(usePromo ? { discounts: [{ promotion_code: usePromo.providerPromotionCodeId! }] } : {}),
      metadata: { studioId, userId, ...(usePromo ? { promoCode: usePromo.code } : {}) },
    });
    if (d.state === 'canceled') sub = await b.stripe.subscriptions.cancel(sub.id);
    const periodEnd = sub.status === 'trialing' ? sub.trial_end : sub.items.data[0]?.current_period_end;
    const values = {
      providerCustomerId: customer.id,
      providerSubscriptionId: sub.id,
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
