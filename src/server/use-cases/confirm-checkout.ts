import type { BillingDeps } from '../payments/billing-deps';
import { syncMembership } from '../services/billing-webhooks';
import { assertCan, type Actor } from './actor';

/**
 * A member came back from the payment page. The webhook may still be on its way, so the
 * membership is read from the provider now and stored, and the account page is right at once.
 * The webhook stays the authority: this only fills the gap, and a failure here changes nothing.
 */
export async function confirmCheckout(actor: Actor, deps: BillingDeps): Promise<void> {
  assertCan(actor, 'membership.manage');
  await syncMembership(deps, actor.studioId, actor.userId).catch((err: unknown) => {
    console.error('membership sync after checkout failed; the webhook will bring it:', err);
  });
}
