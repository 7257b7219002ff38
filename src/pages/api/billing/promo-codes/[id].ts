import type { APIRoute } from 'astro';
import { promoOutput, promoPatchInput } from '~/lib/api/billing-schemas';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requireActor } from '~/server/http/guards';
import { billingDeps } from '~/server/payments/billing-deps';
import { setPromoCodeActive } from '~/server/use-cases/studio-billing';

/** Deactivates (or reactivates) a promo code. */
export const PATCH: APIRoute = endpoint(async ({ locals, params, request }) => {
  const actor = requireActor(locals);
  const { active } = await readJson(request, promoPatchInput);
  return answer(promoOutput, await setPromoCodeActive(actor, billingDeps(), { id: params.id!, active }));
});
