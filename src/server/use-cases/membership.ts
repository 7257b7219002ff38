import type { CheckoutInput } from '~/lib/api/billing-schemas';
import { env } from '../env';
import type { BillingDeps } from '../payments/billing-deps';
import { setCancelAtPeriodEnd, startCheckout } from '../services/billing';
import { assertCan, type Actor } from './actor';

/** Opens the hosted payment page for a member's membership (trial once, optional promo code). */
export async function startMembership(
  actor: Actor,
  deps: BillingDeps,
  input: CheckoutInput & { payer: { email: string; name: string } },
): Promise<{ url: string }> {
  assertCan(actor, 'membership.manage');
  const { payer, ...checkout } = input;
  return startCheckout(deps, actor.studioId, { id: actor.userId, ...payer }, checkout, env().PUBLIC_BASE_URL);
}

/** Cancels at the end of the period (or trial); watching continues until then. */
export async function cancelMembership(actor: Actor, deps: BillingDeps) {
  assertCan(actor, 'membership.manage');
  return setCancelAtPeriodEnd(deps, actor.studioId, actor.userId, true);
}

/** Takes back a cancellation before the period ends. */
export async function resumeMembership(actor: Actor, deps: BillingDeps) {
  assertCan(actor, 'membership.manage');
  return setCancelAtPeriodEnd(deps, actor.studioId, actor.userId, false);
}
