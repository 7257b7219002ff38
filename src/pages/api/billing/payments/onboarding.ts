import type { APIRoute } from 'astro';
import { onboardingLinkOutput } from '~/lib/api/billing-schemas';
import { answer, endpoint } from '~/server/http/api';
import { requireActor, requireUser } from '~/server/http/guards';
import { billingDeps } from '~/server/payments/billing-deps';
import { connectPayments } from '~/server/use-cases/studio-payments';

export const POST: APIRoute = endpoint(async ({ locals }) => {
  const actor = requireActor(locals);
  const { user } = requireUser(locals);
  return answer(onboardingLinkOutput, await connectPayments(actor, billingDeps(), { ownerEmail: user.email }));
});
