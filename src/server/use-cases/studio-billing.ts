import type { BillingSettingsInput, PromoCreateInput } from '~/lib/api/billing-schemas';
import type { BillingDeps } from '../payments/billing-deps';
import { createPromoCode, setPromoActive, updateBillingSettings } from '../services/billing';
import { assertCan, type Actor } from './actor';

/** Sets the monthly price, trial and grace days (owner); current members keep what they signed up for. */
export async function updateMembershipSettings(actor: Actor, deps: BillingDeps, input: BillingSettingsInput) {
  assertCan(actor, 'billing.manage');
  return updateBillingSettings(deps, actor.studioId, input);
}

/** Creates a promo code for a first month (owner), at the payment provider too. */
export async function createPromo(actor: Actor, deps: BillingDeps, input: PromoCreateInput) {
  assertCan(actor, 'billing.manage');
  return createPromoCode(deps, actor.studioId, input);
}

/** Deactivates or reactivates a promo code (owner); members who used it keep their discount. */
export async function setPromoCodeActive(actor: Actor, deps: BillingDeps, input: { id: string; active: boolean }) {
  assertCan(actor, 'billing.manage');
  return setPromoActive(deps, actor.studioId, input.id, input.active);
}
