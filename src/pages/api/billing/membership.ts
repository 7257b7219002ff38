import type { APIRoute } from 'astro';
import { app } from '~/server/app';
import { endpoint, json } from '~/server/http/api';
import { requireCan } from '~/server/http/guards';
import { membershipOf } from '~/server/services/billing';

/** The signed-in member's own membership. */
export const GET: APIRoute = endpoint(async ({ locals }) => {
  const { user, studio } = requireCan(locals, 'membership.manage');
  const { status, trialEnd, currentPeriodEnd, cancelAtPeriodEnd, promoCode, entitled } = await membershipOf(app(), studio.studioId, user.id);
  return json({ status, trialEnd, currentPeriodEnd, cancelAtPeriodEnd, promoCode, entitled });
});
