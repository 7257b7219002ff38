import type { APIRoute } from 'astro';
import { checkoutInput, checkoutOutput } from '~/lib/api/billing-schemas';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requireActor, requireUser } from '~/server/http/guards';
import { billingDeps } from '~/server/payments/billing-deps';
import { startMembership } from '~/server/use-cases/membership';

/** Opens the hosted payment page for the membership (trial and optional promo code). */
export const POST: APIRoute = endpoint(async ({ locals, request }) => {
  const actor = requireActor(locals);
  const { user } = requireUser(locals);
  const input = await readJson(request, checkoutInput);
  return answer(checkoutOutput, await startMembership(actor, billingDeps(), { ...input, payer: { email: user.email, name: user.name } }));
});
