import type { APIRoute } from 'astro';
import { webhookReceivedOutput } from '~/lib/api/billing-schemas';
import { answer, endpoint, readBodyText } from '~/server/http/api';
import { billingDeps } from '~/server/payments/billing-deps';
import { webhookSecrets } from '~/server/payments/stripe-client';
import { receiveWebhook } from '~/server/services/billing-webhooks';

/**
 * The payment provider's signed events, the platform's own and its connected accounts' (each
 * routed to the studio that owns the account). The raw body is verified as received
 * (re-serialised JSON would not match the signature); a repeat of an event already applied
 * answers 200 too.
 */
export const POST: APIRoute = endpoint(async ({ request }) => {
  const result = await receiveWebhook(billingDeps(), await readBodyText(request), request.headers.get('stripe-signature'), webhookSecrets());
  return answer(webhookReceivedOutput, { received: true, ...result });
});
