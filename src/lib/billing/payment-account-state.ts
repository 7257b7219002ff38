/**
 * Where a studio stands with its own payment account, from the provider's three flags. Pure, so
 * the Payments section, the join and checkout refusals and the tests read the same words.
 */
export type PaymentAccountState = 'none' | 'onboarding' | 'restricted' | 'ready';

export interface PaymentAccountFlags {
  detailsSubmitted: boolean;
  chargesEnabled: boolean;
  payoutsEnabled: boolean;
}

/**
 * none: never connected; onboarding: the owner has not finished the provider's form; restricted:
 * the form is in but the provider still needs something, so nothing can be sold (or paid out);
 * ready: members can pay. Charges without payouts still sell (the money waits at the provider).
 */
export function paymentAccountState(flags: PaymentAccountFlags | null | undefined): PaymentAccountState {
  if (!flags) return 'none';
  if (flags.chargesEnabled) return 'ready';
  return flags.detailsSubmitted ? 'restricted' : 'onboarding';
}

/** Whether memberships can be sold on this account now. */
export const canSell = (flags: PaymentAccountFlags | null | undefined) => paymentAccountState(flags) === 'ready';

/** What a member or visitor is told when the studio cannot take payments yet. */
export const NOT_SELLING_MESSAGE =
  'This studio is not taking new memberships yet: its owner is still setting up payments. Nothing was charged. Please check back soon.';

/** The owner's headline for each state in the Payments section. */
export const PAYMENT_STATE_WORDS: Record<PaymentAccountState, { title: string; detail: string }> = {
  none: {
    title: 'Not connected',
    detail: 'Connect a payment account so members can pay you. Until then your classes can be published, but nobody can buy a membership.',
  },
  onboarding: {
    title: 'Setup not finished',
    detail: 'The payment provider still needs your business and bank details. Continue where you left off; members cannot buy a membership until it is done.',
  },
  restricted: {
    title: 'Waiting on the payment provider',
    detail: 'Your details are in, but the provider still needs something before members can pay. Continue setup to see what is missing.',
  },
  ready: {
    title: 'Ready to take payments',
    detail: 'Members pay your studio directly. Payouts go to the bank account you gave the payment provider.',
  },
};
