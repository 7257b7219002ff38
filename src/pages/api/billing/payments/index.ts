import type { APIRoute } from 'astro';
import { paymentAccountOutput } from '~/lib/api/billing-schemas';
import { answer, endpoint } from '~/server/http/api';
import { requireActor } from '~/server/http/guards';
import { billingDeps } from '~/server/payments/billing-deps';
import { viewPayments } from '~/server/use-cases/studio-payments';

export const GET: APIRoute = endpoint(async ({ locals }) => answer(paymentAccountOutput, await viewPayments(requireActor(locals), billingDeps())));
