import type { APIRoute } from 'astro';
import { endpoint, json } from '~/server/http/api';
import { requireCan } from '~/server/http/guards';
import { billingDeps } from '~/server/payments/billing-deps';
import { setCancelAtPeriodEnd } from '~/server/services/billing';

/** Cancels at the end of the current period (or trial); watching continues until then. */
export const POST: APIRoute = endpoint(async ({ locals }) => {
  const { user, studio } = requireCan(locals, 'membership.manage');
  return json(await setCancelAtPeriodEnd(billingDeps(), studio.studioId, user.id, true));
});
