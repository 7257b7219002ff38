import { and, count, eq, isNotNull, sql } from 'drizzle-orm';
import Stripe from 'stripe';
import { billingSettings, promoCodes, studios, subscriptions } from '~/db/schema';
import type { BillingSettingsInput, CheckoutInput, MembershipOutput, PromoCreateInput } from '~/lib/api/billing-schemas';
import { formatInstant } from '~/lib/time/date-format';
import { AppError, notFound } from '../errors';
import type { AppDeps } from '../app';
import type { BillingDeps } from '../payments/billing-deps';
import { env } from '../env';
import { entitledBy } from './entitlement';
import { onAccount, salesOpen, sellingAccount } from './payment-accounts';
import { studioClock } from './studio-clock';

/** Statuses in which a member has a running membership (and cannot start another). */
export const LIVE_STATUSES = ['trialing', 'active', 'past_due'] as const;
const isLive = (status: string | undefined) => !!status && (LIVE_STATUSES as readonly string[]).includes(status);

/**
 * Runs a call to the payment provider and turns its failures into messages people can act on.
 * Invalid requests keep the provider's message (it names the problem); the rest are "try again".
 */
export async function provider<T>(call: () => Promise<T>): Promise<T> {
  try {
    return await call();
  } catch (err) {
    if (err instanceof Stripe.errors.StripeConnectionError || err instanceof Stripe.errors.StripeAPIError) {
      throw new AppError('unavailable', 'Payments cannot be reached right now. Nothing was changed; please try again in a minute.');
    }
    if (err instanceof Stripe.errors.StripeInvalidRequestError) throw new AppError('invalid_input', err.message);
    throw err;
  }
}

// ------------------------------------------------------------------------------------------
// Owner settings: price and trial

export interface BillingSettingsView {
  currency: string;
  monthlyPriceMinor: number;
  trialDays: number;
  pastDueGraceDays: number;
  version: string | null;
}

/** The studio's offer; a studio without one yet shows sensible starting values. */
export async function getBillingSettings(deps: AppDeps, studioId: string): Promise<BillingSettingsView> {
  const row = await deps.db.query.billingSettings.findFirst({ where: eq(billingSettings.studioId, studioId) });
  if (!row) return { currency: 'eur', monthlyPriceMinor: 1900, trialDays: 14, pastDueGraceDays: 3, version: null };
  return { currency: row.currency, monthlyPriceMinor: row.monthlyPriceMinor, trialDays: row.trialDays, pastDueGraceDays: row.pastDueGraceDays, version: row.updatedAt.toISOString() };
}

/**
 * Makes sure the studio's connected account has the product and the current monthly price. A
 * changed price becomes a new provider price (prices cannot change there); existing members
 * keep the price they signed up with, as the provider does. Ids stored for another account
 * (the platform's own, before the studio connected) are replaced by ones on this account.
 */
export async function ensurePrice(deps: BillingDeps, studioId: string, opts: { verify?: boolean } = {}) {
  const row = await deps.db.query.billingSettings.findFirst({ where: eq(billingSettings.studioId, studioId) });
  if (!row) throw new AppError('unavailable', 'Memberships are not open yet: the studio has not set a price. Please check back soon.');
  const accountId = await sellingAccount(deps, studioId);
  const on = onAccount(accountId);
  const sameAccount = row.providerAccountId === accountId;
  let productId = sameAccount ? row.providerProductId : null;
  let priceId = sameAccount ? row.providerPriceId : null;
  if (opts.verify && productId) {
    // After the provider's data was reset (e.g. a fresh local fake) the stored ids point nowhere.
    const alive = await deps.stripe.products.retrieve(productId, {}, on).then(() => true, () => false);
    if (!alive) productId = priceId = null;
  }
  if (priceId) {
    const price = await provider(() => deps.stripe.prices.retrieve(priceId!, {}, on)).catch(() => null);
    if (!price || !price.active || price.unit_amount !== row.monthlyPriceMinor || price.currency !== row.currency) {
      if (price?.active) await provider(() => deps.stripe.prices.update(priceId!, { active: false }, on));
      priceId = null;
    }
  }
  if (!productId) {
    const studio = await deps.db.query.studios.findFirst({ where: eq(studios.id, studioId) });
    const product = await provider(() => deps.stripe.products.create({ name: `${studio?.name ?? 'Studio'} membership`, metadata: { studioId } }, on));
    productId = product.id;
  }
  if (!priceId) {
    const price = await provider(() =>
      deps.stripe.prices.create({ product: productId!, currency: row.currency, unit_amount: row.monthlyPriceMinor, recurring: { interval: 'month' }, metadata: { studioId } }, on),
    );
    priceId = price.id;
  }
  if (productId !== row.providerProductId || priceId !== row.providerPriceId || !sameAccount) {
    await deps.db
      .update(billingSettings)
      .set({ providerProductId: productId, providerPriceId: priceId, providerAccountId: accountId })
      .where(eq(billingSettings.studioId, studioId));
  }
  return { ...row, providerProductId: productId, providerPriceId: priceId, providerAccountId: accountId };
}

/** Saves price, trial and grace; `version` must match what was read (409 otherwise). */
export async function updateBillingSettings(deps: BillingDeps, studioId: string, input: BillingSettingsInput): Promise<BillingSettingsView> {
  const current = await deps.db.query.billingSettings.findFirst({ where: eq(billingSettings.studioId, studioId) });
  const currentVersion = current ? current.updatedAt.toISOString() : null;
  if (input.version !== currentVersion) {
    throw new AppError('conflict', 'Someone changed these settings while you were editing. Reload to see theirs, then make your change again.', undefined, { currentVersion });
  }
  const values = { monthlyPriceMinor: input.monthlyPriceMinor, trialDays: input.trialDays, pastDueGraceDays: input.pastDueGraceDays, updatedAt: new Date() };
  if (current) {
    const updated = await deps.db
      .update(billingSettings)
      .set(values)
      // The column keeps microseconds (a row written with now()), the version read back only milliseconds.
      .where(and(eq(billingSettings.studioId, studioId), sql`date_trunc('milliseconds', ${billingSettings.updatedAt}) = ${current.updatedAt.toISOString()}`))
      .returning();
    if (!updated.length) throw new AppError('conflict', 'Someone changed these settings while you were editing. Reload and try again.');
  } else {
    const inserted = await deps.db.insert(billingSettings).values({ studioId, ...values }).onConflictDoNothing().returning();
    if (!inserted.length) throw new AppError('conflict', 'Someone saved these settings first. Reload and try again.');
  }
  // The price reaches the provider once the studio can sell; until then it waits here.
  if (await salesOpen(deps, studioId)) await ensurePrice(deps, studioId);
  return getBillingSettings(deps, studioId);
}

// ------------------------------------------------------------------------------------------
// Promo codes

export interface PromoView {
  id: string;
  code: string;
  percentOff: number;
  expiresAt: string | null;
  active: boolean;
  state: 'active' | 'expired' | 'inactive';
  redemptions: number;
  createdAt: string;
}

function promoState(row: { active: boolean; expiresAt: Date | null }, now = new Date()): PromoView['state'] {
  if (!row.active) return 'inactive';
  if (row.expiresAt && row.expiresAt <= now) return 'expired';
  return 'active';
}

/** The studio's promo codes, newest first, each with how many memberships used it. */
export async function listPromoCodes(deps: AppDeps, studioId: string): Promise<PromoView[]> {
  const rows = await deps.db.select().from(promoCodes).where(eq(promoCodes.studioId, studioId)).orderBy(sql`${promoCodes.createdAt} desc`);
  const used = await deps.db
    .select({ code: subscriptions.promoCode, n: count() })
    .from(subscriptions)
    .where(and(eq(subscriptions.studioId, studioId), isNotNull(subscriptions.promoCode), isNotNull(subscriptions.providerSubscriptionId)))
    .groupBy(subscriptions.promoCode);
  const byCode = new Map(used.map((u) => [u.code, u.n]));
  return rows.map((r) => ({
    id: r.id,
    code: r.code,
    percentOff: r.percentOff,
    expiresAt: r.expiresAt?.toISOString() ?? null,
    active: r.active,
    state: promoState(r),
    redemptions: byCode.get(r.code) ?? 0,
    createdAt: r.createdAt.toISOString(),
  }));
}

/** Creates a percent-off-the-first-month code, here and at the provider. */
export async function createPromoCode(deps: BillingDeps, studioId: string, input: PromoCreateInput): Promise<PromoView> {
  const expiresAt = input.expiresAt ? new Date(input.expiresAt) : null;
  if (expiresAt && expiresAt.getTime() <= Date.now()) {
    throw new AppError('invalid_input', 'The expiry is in the past. Pick a later date, or leave it empty.', { expiresAt: 'The expiry is in the past. Pick a later date, or leave it empty.' });
  }
  const taken = await deps.db.query.promoCodes.findFirst({ where: and(eq(promoCodes.studioId, studioId), eq(promoCodes.code, input.code)) });
  if (taken) throw new AppError('conflict', `The code ${input.code} already exists. Choose another name.`, { code: `The code ${input.code} already exists. Choose another name.` });
  // On a studio that can sell, the code is made on its account now (so a clash there shows at
  // once); otherwise it waits here and is made there at the first checkout that uses it.
  const mirrored = (await salesOpen(deps, studioId)) ? await mirrorPromo(deps, studioId, { code: input.code, percentOff: input.percentOff, expiresAt }) : null;
  const [row] = await deps.db
    .insert(promoCodes)
    .values({ studioId, code: input.code, percentOff: input.percentOff, expiresAt, ...mirrored })
    .returning();
  return { id: row!.id, code: row!.code, percentOff: row!.percentOff, expiresAt: row!.expiresAt?.toISOString() ?? null, active: true, state: promoState(row!), redemptions: 0, createdAt: row!.createdAt.toISOString() };
}

/** Makes a promo code's coupon and code on the studio's connected account; answers their ids. */
async function mirrorPromo(deps: BillingDeps, studioId: string, promo: { code: string; percentOff: number; expiresAt: Date | null }) {
  const accountId = await sellingAccount(deps, studioId);
  const on = onAccount(accountId);
  const clash = await provider(() => deps.stripe.promotionCodes.list({ code: promo.code, active: true, limit: 1 }, on));
  if (clash.data.length) {
    const message = `The code ${promo.code} is already in use at the payment provider. Choose another name.`;
    throw new AppError('conflict', message, { code: message });
  }
  const coupon = await provider(() =>
    deps.stripe.coupons.create({ percent_off: promo.percentOff, duration: 'once', name: `${promo.code}: ${promo.percentOff}% off the first month`, metadata: { studioId } }, on),
  );
  const made = await provider(() =>
    deps.stripe.promotionCodes.create(
      {
        promotion: { type: 'coupon', coupon: coupon.id },
        code: promo.code,
        ...(promo.expiresAt ? { expires_at: Math.floor(promo.expiresAt.getTime() / 1000) } : {}),
        metadata: { studioId },
      },
      on,
    ),
  );
  return { providerCouponId: coupon.id, providerPromotionCodeId: made.id, providerAccountId: accountId };
}

/** Deactivates (or reactivates) a code; members who already used it keep their discount. */
export async function setPromoActive(deps: BillingDeps, studioId: string, id: string, active: boolean): Promise<PromoView> {
  const row = /^[0-9a-f-]{36}$/i.test(id) ? await deps.db.query.promoCodes.findFirst({ where: and(eq(promoCodes.id, id), eq(promoCodes.studioId, studioId)) }) : undefined;
  if (!row) throw notFound('That promo code');
  // A code not made on the account yet has nothing there to change; checkout reads `active` here.
  if (row.providerPromotionCodeId && row.providerAccountId) {
    await provider(() => deps.stripe.promotionCodes.update(row.providerPromotionCodeId!, { active }, onAccount(row.providerAccountId)));
  }
  await deps.db.update(promoCodes).set({ active }).where(eq(promoCodes.id, id));
  const view = (await listPromoCodes(deps, studioId)).find((p) => p.id === id)!;
  return view;
}

/** The code a member typed, if the studio still honours it; otherwise a message saying why not. */
async function usablePromo(deps: AppDeps, studioId: string, code: string) {
  const refuse = (message: string) => new AppError('invalid_input', message, { promoCode: message });
  const row = await deps.db.query.promoCodes.findFirst({ where: and(eq(promoCodes.studioId, studioId), eq(promoCodes.code, code)) });
  if (!row) throw refuse(`We don't recognise the code ${code}. Check the spelling, or leave the field empty.`);
  if (!row.active) throw refuse(`The code ${code} is no longer active. Leave the field empty to start without it.`);
  if (row.expiresAt && row.expiresAt <= new Date()) throw refuse(`The code ${code} expired on ${formatInstant(row.expiresAt, await studioClock(deps, studioId), 'day')}. Leave the field empty to start without it.`);
  return row;
}

// ------------------------------------------------------------------------------------------
// Members: checkout, cancel, resume

/** A member's subscription row in the studio, if any. */
export async function subscriptionOf(deps: AppDeps, studioId: string, userId: string) {
  return deps.db.query.subscriptions.findFirst({ where: and(eq(subscriptions.studioId, studioId), eq(subscriptions.userId, userId)) });
}

/**
 * Opens a hosted checkout for the monthly membership, with the studio's trial for people who
 * never had one and an optional promo code (refused here, with the reason, before any redirect).
 */
export async function startCheckout(
  deps: BillingDeps,
  studioId: string,
  user: { id: string; email: string; name: string },
  input: CheckoutInput,
  baseUrl: string,
): Promise<{ url: string }> {
  const existing = await subscriptionOf(deps, studioId, user.id);
  if (existing && isLive(existing.status)) {
    throw new AppError('conflict', 'You already have a membership. You can manage it on your account page.');
  }
  // Said before anything else, so a visitor of a studio that cannot sell learns it plainly.
  const accountId = await sellingAccount(deps, studioId);
  const on = onAccount(accountId);
  let promo = input.promoCode ? await usablePromo(deps, studioId, input.promoCode) : null;
  if (promo && promo.providerAccountId !== accountId) {
    const mirrored = await mirrorPromo(deps, studioId, promo);
    await deps.db.update(promoCodes).set(mirrored).where(eq(promoCodes.id, promo.id));
    promo = { ...promo, ...mirrored };
  }
  const settings = await ensurePrice(deps, studioId);
  // One free trial per person: whoever had a subscription before pays from the first day.
  const trialDays = existing?.providerSubscriptionId ? 0 : settings.trialDays;
  // Customers live on the studio's account: one stored for another account is not reused.
  let customerId = existing?.providerAccountId === accountId ? (existing.providerCustomerId ?? null) : null;
  if (!customerId) {
    const customer = await provider(() => deps.stripe.customers.create({ email: user.email, name: user.name, metadata: { userId: user.id, studioId } }, on));
    customerId = customer.id;
    const fresh = { providerCustomerId: customerId, providerAccountId: accountId, updatedAt: new Date() };
    await deps.db
      .insert(subscriptions)
      .values({ studioId, userId: user.id, ...fresh })
      .onConflictDoUpdate({ target: [subscriptions.studioId, subscriptions.userId], set: fresh });
  }
  const ids = { studioId, userId: user.id, ...(promo ? { promoCode: promo.code } : {}) };
  const session = await provider(() =>
    deps.stripe.checkout.sessions.create({
      mode: 'subscription',
      customer: customerId!,
      client_reference_id: user.id,
      line_items: [{ price: settings.providerPriceId!, quantity: 1 }],
      subscription_data: {
        ...(trialDays > 0 ? { trial_period_days: trialDays } : {}),
        // The platform's cut of every invoice of this membership; the rest is the studio's.
        application_fee_percent: env().PLATFORM_FEE_PERCENT,
        metadata: ids,
      },
      metadata: ids,
      ...(promo ? { discounts: [{ promotion_code: promo.providerPromotionCodeId! }] } : {}),
      success_url: `${baseUrl}/account/checkout-return`,
      cancel_url: `${baseUrl}/account?checkout=cancelled`,
    }, on),
  );
  if (!session.url) throw new AppError('unavailable', 'The payment page could not be opened. Please try again.');
  return { url: session.url };
}

/** The member's membership as the account page and the API show it. */
export async function membershipOf(deps: AppDeps, studioId: string, userId: string) {
  const [row, settings] = await Promise.all([subscriptionOf(deps, studioId, userId), getBillingSettings(deps, studioId)]);
  const has = !!row?.providerSubscriptionId;
  const promo = row?.promoCode ? await deps.db.query.promoCodes.findFirst({ where: and(eq(promoCodes.studioId, studioId), eq(promoCodes.code, row.promoCode)) }) : undefined;
  // The first charge after a trial carries the promo discount (percent off the first month).
  const nextAmount = row?.status === 'trialing' && promo ? settings.monthlyPriceMinor - Math.round((settings.monthlyPriceMinor * promo.percentOff) / 100) : settings.monthlyPriceMinor;
  const nextChargeAt = row && isLive(row.status) && !row.cancelAtPeriodEnd ? (row.status === 'trialing' ? row.trialEnd : row.currentPeriodEnd) : null;
  const open = await salesOpen(deps, studioId);
  return {
    /** Whether the studio can take a new membership now (its payment account is ready). */
    salesOpen: open,
    status: (has ? row!.status : 'none') as MembershipOutput['status'],
    trialEnd: row?.trialEnd?.toISOString() ?? null,
    currentPeriodEnd: row?.currentPeriodEnd?.toISOString() ?? null,
    cancelAtPeriodEnd: row?.cancelAtPeriodEnd ?? false,
    promoCode: row?.promoCode ?? null,
    entitled: has && entitledBy(row!, settings.pastDueGraceDays),
    nextCharge: nextChargeAt ? { at: nextChargeAt.toISOString(), amountMinor: nextAmount } : null,
    settings,
    trialOffered: !has && settings.trialDays > 0,
  };
}

/** Sets or clears "cancel at the end of the period"; watching continues until then. */
export async function setCancelAtPeriodEnd(deps: BillingDeps, studioId: string, userId: string, cancel: boolean) {
  const row = await subscriptionOf(deps, studioId, userId);
  if (!row?.providerSubscriptionId || !isLive(row.status)) {
    throw new AppError('conflict', cancel ? 'You have no running membership to cancel.' : 'There is no membership to resume. Start a new one from your account page.');
  }
  const sub = await provider(() => deps.stripe.subscriptions.update(row.providerSubscriptionId!, { cancel_at_period_end: cancel }, onAccount(row.providerAccountId)));
  await deps.db
    .update(subscriptions)
    .set({ cancelAtPeriodEnd: sub.cancel_at_period_end || sub.cancel_at != null, updatedAt: new Date() })
    .where(eq(subscriptions.id, row.id));
  return membershipAnswer(await membershipOf(deps, studioId, userId));
}

/** The part of the membership view the API answers (the page shows more: next charge, settings). */
export function membershipAnswer(view: Awaited<ReturnType<typeof membershipOf>>): MembershipOutput {
  const { status, trialEnd, currentPeriodEnd, cancelAtPeriodEnd, promoCode, entitled } = view;
  return { status, trialEnd, currentPeriodEnd, cancelAtPeriodEnd, promoCode, entitled };
}
