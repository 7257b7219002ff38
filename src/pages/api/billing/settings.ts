import type { APIRoute } from 'astro';
import { billingSettingsInput, billingSettingsOutput } from '~/lib/api/billing-schemas';
import { app } from '~/server/app';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requireActor, requireCan } from '~/server/http/guards';
import { billingDeps } from '~/server/payments/billing-deps';
import { getBillingSettings } from '~/server/services/billing';
import { updateMembershipSettings } from '~/server/use-cases/studio-billing';

export const GET: APIRoute = endpoint(async ({ locals }) => {
  const { studio } = requireCan(locals, 'billing.manage');
  return answer(billingSettingsOutput, await getBillingSettings(app(), studio.studioId));
});

export const PUT: APIRoute = endpoint(async ({ locals, request }) => {
  const actor = requireActor(locals);
  const input = await readJson(request, billingSettingsInput);
  return answer(billingSettingsOutput, await updateMembershipSettings(actor, billingDeps(), input));
});
