import type { APIRoute } from 'astro';
import { membershipOutput } from '~/lib/api/billing-schemas';
import { answer, endpoint } from '~/server/http/api';
import { requireActor } from '~/server/http/guards';
import { billingDeps } from '~/server/payments/billing-deps';
import { resumeMembership } from '~/server/use-cases/membership';

/** Takes back a cancellation before the period ends. */
export const POST: APIRoute = endpoint(async ({ locals }) => answer(membershipOutput, await resumeMembership(requireActor(locals), billingDeps())));
