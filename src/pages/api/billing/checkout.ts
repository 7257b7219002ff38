import type { APIRoute } from 'astro';
import { checkoutInput } from '~/lib/api/billing-schemas';
import { env } from '~/server/env';
import { endpoint, json, readJson } from '~/server/http/api';
import { requireCan } from '~/server/http/guards';
import { billingDeps } from '~/server/payments/billing-deps';
import { startCheckout } from '~/server/services/billing';

/** Opens the hosted payment page for the membership (trial and optional promo code). */
export const POST: APIRoute = endpoint(async ({ locals, request }) => {
  const { user, studio } = requireCan(locals, 'membership.manage');
  const input = await readJson(request, checkoutInput);
  return json(await startCheckout(billingDeps(), studio.studioId, user, input, env().PUBLIC_BASE_URL));
});
