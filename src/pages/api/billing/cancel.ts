import type { APIRoute } from 'astro';
import { membershipOutput } from '~/lib/api/billing-schemas';
import { answer, endpoint } from '~/server/http/api';
import { requireActor } from '~/server/http/guards';
import { billingDeps } from '~/server/payments/billing-deps';
import { cancelMembership } from '~/server/use-cases/membership';

/** Cancels at the end of the current period (or trial); watching continues until then. */
export const POST: APIRoute = endpoint(async ({ locals }) => answer(membershipOutput, await cancelMembership(requireActor(locals), billingDeps())));
