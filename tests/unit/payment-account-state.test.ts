// Where a studio stands with its payment account, from the provider's three flags (invented combinations).
import { describe, expect, it } from 'vitest';
import { canSell, paymentAccountState } from '~/lib/billing/payment-account-state';

const flags = (detailsSubmitted: boolean, chargesEnabled: boolean, payoutsEnabled: boolean) => ({ detailsSubmitted, chargesEnabled, payoutsEnabled });

describe('paymentAccountState', () => {
  it.each([
    ['no account', null, 'none', false],
    ['form not finished', flags(false, false, false), 'onboarding', false],
    ['details in, provider still needs something', flags(true, false, false), 'restricted', false],
    ['charges and payouts on', flags(true, true, true), 'ready', true],
    // Charges without payouts still sell: the money waits at the provider until payouts are on.
    ['charges on, payouts paused', flags(true, true, false), 'ready', true],
  ] as const)('%s → %s', (_label, input, state, sells) => {
    expect(paymentAccountState(input)).toBe(state);
    expect(canSell(input)).toBe(sells);
  });
});
