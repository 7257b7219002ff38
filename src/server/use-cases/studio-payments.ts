import { env } from '../env';
import type { BillingDeps } from '../payments/billing-deps';
import { onboardingLink, paymentAccountView } from '../services/payment-accounts';
import { assertCan, type Actor } from './actor';

/**
 * Connects the studio's own payment account, or continues its setup (owner): answers the
 * provider's onboarding page, which sends the owner back to the Payments section.
 */
export async function connectPayments(actor: Actor, deps: BillingDeps, input: { ownerEmail: string }): Promise<{ url: string }> {
  assertCan(actor, 'billing.manage');
  return onboardingLink(deps, actor.studioId, { email: input.ownerEmail }, env().PUBLIC_BASE_URL);
}

/** Where the studio's payment account stands, asked of the provider now (owner). */
export async function viewPayments(actor: Actor, deps: BillingDeps) {
  assertCan(actor, 'billing.manage');
  return paymentAccountView(deps, actor.studioId, { refresh: true });
}
