import type { APIRoute } from 'astro';
import { AppError } from '~/server/errors';
import { requireActor } from '~/server/http/guards';
import { billingDeps } from '~/server/payments/billing-deps';
import { confirmCheckout } from '~/server/use-cases/confirm-checkout';

/** Where the payment page sends a member back after paying: store what the provider says, then show the account. */
export const GET: APIRoute = async ({ locals, redirect }) => {
  try {
    await confirmCheckout(requireActor(locals), billingDeps());
  } catch (err) {
    if (!(err instanceof AppError)) throw err;
    if (err.code === 'unauthenticated') return redirect('/sign-in?next=/account', 303);
  }
  return redirect('/account?checkout=success', 303);
};
