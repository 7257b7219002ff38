import type { APIRoute } from 'astro';
import { endpoint, json } from '~/server/http/api';
import { requireCan } from '~/server/http/guards';
import { billingDeps } from '~/server/payments/billing-deps';
import { setCancelAtPeriodEnd } from '~/server/services/billing';

/** Takes back a cancellation before the period ends. */
export const POST: APIRoute = endpoint(async ({ locals }) => {
  const { user, studio } = requireCan(locals, 'membership.manage');
  return json(await setCancelAtPeriodEnd(billingDeps(), studio.studioId, user.id, false));
});
