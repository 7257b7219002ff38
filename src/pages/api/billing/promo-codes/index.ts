import type { APIRoute } from 'astro';
import { promoCreateInput, promoListOutput, promoOutput } from '~/lib/api/billing-schemas';
import { app } from '~/server/app';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requireActor, requireCan } from '~/server/http/guards';
import { billingDeps } from '~/server/payments/billing-deps';
import { listPromoCodes } from '~/server/services/billing';
import { createPromo } from '~/server/use-cases/studio-billing';

export const GET: APIRoute = endpoint(async ({ locals }) => {
  const { studio } = requireCan(locals, 'billing.manage');
  return answer(promoListOutput, { promoCodes: await listPromoCodes(app(), studio.studioId) });
});

export const POST: APIRoute = endpoint(async ({ locals, request }) => {
  const actor = requireActor(locals);
  const input = await readJson(request, promoCreateInput);
  return answer(promoOutput, await createPromo(actor, billingDeps(), input), 201);
});
