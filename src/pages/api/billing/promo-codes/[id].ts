import type { APIRoute } from 'astro';
import { promoPatchInput } from '~/lib/api/billing-schemas';
import { endpoint, json, readJson } from '~/server/http/api';
import { requireCan } from '~/server/http/guards';
import { billingDeps } from '~/server/payments/billing-deps';
import { setPromoActive } from '~/server/services/billing';

/** Deactivates (or reactivates) a promo code. */
export const PATCH: APIRoute = endpoint(async ({ locals, params, request }) => {
  const { studio } = requireCan(locals, 'billing.manage');
  const { active } = await readJson(request, promoPatchInput);
  return json(await setPromoActive(billingDeps(), studio.studioId, params.id!, active));
});
