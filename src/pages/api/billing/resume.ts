import type { APIRoute } from 'astro';
import { endpoint, json } from '~/server/http/api';
import { requireActor } from '~/server/http/guards';
import { billingDeps } from '~/server/payments/billing-deps';
import { resumeMembership } from '~/server/use-cases/membership';

/** Takes back a cancellation before the period ends. */
export const POST: APIRoute = endpoint(async ({ locals }) => json(await resumeMembership(requireActor(locals), billingDeps())));
