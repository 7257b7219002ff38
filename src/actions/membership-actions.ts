import { checkoutInput } from '~/lib/api/billing-schemas';
import { parseWith } from '~/server/http/api';
import { requireActor, requireUser } from '~/server/http/guards';
import { billingDeps } from '~/server/payments/billing-deps';
import { cancelMembership, resumeMembership, startMembership } from '~/server/use-cases/membership';
import { formAction } from './form-action';

export const membershipActions = {
  /** "Your membership" on the account page: start (to the payment page), cancel or resume. Answers where to go next. */
  membership: formAction(async (form, { locals }) => {
    const actor = requireActor(locals);
    switch (form.get('intent')) {
      case 'start': {
        const { user } = requireUser(locals);
        const input = parseWith(checkoutInput, { promoCode: String(form.get('promoCode') ?? '') });
        const { url } = await startMembership(actor, billingDeps(), { ...input, payer: { email: user.email, name: user.name } });
        return url;
      }
      case 'cancel':
        await cancelMembership(actor, billingDeps());
        return '/account?membership=cancelled#membership';
      case 'resume':
        await resumeMembership(actor, billingDeps());
        return '/account?membership=resumed#membership';
      default:
        return '/account#membership';
    }
  }),
};
