import type { APIRoute } from 'astro';
import { AppError } from '~/server/errors';
import { requireActor, requireUser } from '~/server/http/guards';
import { billingDeps } from '~/server/payments/billing-deps';
import { connectPayments } from '~/server/use-cases/studio-payments';

/**
 * The payment provider sends the owner here when an onboarding link has expired or was used
 * (its refresh_url): a fresh link, straight back to the provider. Anyone else, or a failure,
 * lands on the Payments section, which says what to do.
 */
export const GET: APIRoute = async ({ locals, redirect }) => {
  try {
    const { url } = await connectPayments(requireActor(locals), billingDeps(), { ownerEmail: requireUser(locals).user.email });
    return redirect(url, 303);
  } catch (err) {
    if (!(err instanceof AppError)) throw err;
    if (err.code === 'unauthenticated') return redirect('/sign-in?next=/studio/billing%23payments', 303);
    return redirect('/studio/billing?payments=unavailable#payments', 303);
  }
};
