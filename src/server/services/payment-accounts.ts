import { eq } from 'drizzle-orm';
import type Stripe from 'stripe';
import { paymentAccounts, studios } from '~/db/schema';
import { canSell, NOT_SELLING_MESSAGE, paymentAccountState, type PaymentAccountState } from '~/lib/billing/payment-account-state';
import { AppError } from '../errors';
import type { AppDeps } from '../app';
import type { BillingDeps } from '../payments/billing-deps';
import { env } from '../env';
import { provider } from './billing';

export type PaymentAccountRow = typeof paymentAccounts.$inferSelect;

/** Request options that make an SDK call act on a studio's connected account. */
export const onAccount = (accountId: string | null | undefined): Stripe.RequestOptions | undefined =>
  accountId ? { stripeAccount: accountId } : undefined;

/** The studio's connected account as last stored, if it has one. */
export async function paymentAccountOf(deps: AppDeps, studioId: string): Promise<PaymentAccountRow | undefined> {
  return deps.db.query.paymentAccounts.findFirst({ where: eq(paymentAccounts.studioId, studioId) });
}

/** The studio that owns a connected account, if any of ours does. */
export async function studioOfAccount(deps: AppDeps, accountId: string): Promise<PaymentAccountRow | undefined> {
  return deps.db.query.paymentAccounts.findFirst({ where: eq(paymentAccounts.providerAccountId, accountId) });
}

/** The provider's account flags as our row stores them. */
export function flagsOf(account: Stripe.Account) {
  return {
    detailsSubmitted: !!account.details_submitted,
    chargesEnabled: !!account.charges_enabled,
    payoutsEnabled: !!account.payouts_enabled,
    requirementsDue: account.requirements?.currently_due?.length ?? 0,
  };
}

/** Copies the provider's account state into our row (the account id must already be the studio's). */
export async function storeAccountState(deps: AppDeps, account: Stripe.Account): Promise<void> {
  await deps.db
    .update(paymentAccounts)
    .set({ ...flagsOf(account), updatedAt: new Date() })
    .where(eq(paymentAccounts.providerAccountId, account.id));
}

/**
 * The account a studio sells on, or a refusal a member can read. Checked before anything is sent
 * to the provider, so a studio that is not ready never opens a payment page.
 */
export async function sellingAccount(deps: AppDeps, studioId: string): Promise<string> {
  const row = await paymentAccountOf(deps, studioId);
  if (!row || !canSell(row)) throw new AppError('conflict', NOT_SELLING_MESSAGE);
  return row.providerAccountId;
}

/** Whether the studio can sell memberships now (for pages that offer one). */
export async function salesOpen(deps: AppDeps, studioId: string): Promise<boolean> {
  return canSell(await paymentAccountOf(deps, studioId));
}

export interface PaymentAccountView {
  state: PaymentAccountState;
  accountId: string | null;
  detailsSubmitted: boolean;
  chargesEnabled: boolean;
  payoutsEnabled: boolean;
  requirementsDue: number;
  /** The platform's application fee, in percent of each payment. */
  feePercent: number;
}

/**
 * The Payments section's view. With `refresh`, the provider is asked first (the owner may just
 * be back from onboarding, ahead of the account.updated event); if it cannot be reached the
 * stored state is shown.
 */
export async function paymentAccountView(deps: BillingDeps, studioId: string, { refresh = false } = {}): Promise<PaymentAccountView> {
  let row = await paymentAccountOf(deps, studioId);
  if (row && refresh) {
    const account = await deps.stripe.accounts.retrieve(row.providerAccountId).catch((err: unknown) => {
      console.error('payment account not refreshed, showing the stored state:', (err as Error).message);
      return null;
    });
    if (account) {
      await storeAccountState(deps, account);
      row = await paymentAccountOf(deps, studioId);
    }
  }
  return {
    state: paymentAccountState(row),
    accountId: row?.providerAccountId ?? null,
    detailsSubmitted: row?.detailsSubmitted ?? false,
    chargesEnabled: row?.chargesEnabled ?? false,
    payoutsEnabled: row?.payoutsEnabled ?? false,
    requirementsDue: row?.requirementsDue ?? 0,
    feePercent: env().PLATFORM_FEE_PERCENT,
  };
}

/** Where the provider sends the owner back: after onboarding, and when a link has expired. */
export function onboardingUrls(baseUrl: string) {
  const base = baseUrl.replace(/\/$/, '');
  return { returnUrl: `${base}/studio/billing?payments=returned#payments`, refreshUrl: `${base}/studio/billing/payments-link` };
}

/**
 * The studio's connected account, made at the provider if it has none. Two owners pressing at
 * once: the second insert loses and its account is left unused at the provider (it never takes
 * payments); both go on with the stored one.
 */
export async function ensurePaymentAccount(deps: BillingDeps, studioId: string, owner: { email: string }): Promise<PaymentAccountRow> {
  const existing = await paymentAccountOf(deps, studioId);
  if (existing) return existing;
  const studio = await deps.db.query.studios.findFirst({ where: eq(studios.id, studioId) });
  const account = await provider(() =>
    deps.stripe.accounts.create({
      // The studio's own full account: its prices, customers and charges live there (direct charges).
      controller: { fees: { payer: 'account' }, losses: { payments: 'stripe' }, stripe_dashboard: { type: 'full' } },
      email: owner.email,
      business_profile: { name: studio?.name ?? 'Studio' },
      metadata: { studioId },
    }),
  );
  await deps.db.insert(paymentAccounts).values({ studioId, providerAccountId: account.id, ...flagsOf(account) }).onConflictDoNothing();
  return (await paymentAccountOf(deps, studioId))!;
}

/** A fresh single-use onboarding link for the owner, making the account first if needed. */
export async function onboardingLink(deps: BillingDeps, studioId: string, owner: { email: string }, baseUrl: string): Promise<{ url: string }> {
  const row = await ensurePaymentAccount(deps, studioId, owner);
  const { returnUrl, refreshUrl } = onboardingUrls(baseUrl);
  const link = await provider(() =>
    deps.stripe.accountLinks.create({ account: row.providerAccountId, type: 'account_onboarding', return_url: returnUrl, refresh_url: refreshUrl }),
  );
  return { url: link.url };
}
