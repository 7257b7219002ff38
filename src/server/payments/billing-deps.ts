import type Stripe from 'stripe';
import { app, type AppDeps } from '../app';
import { stripe } from './stripe-client';

/** What the billing services need: the app's database plus the payment provider's client. */
export type BillingDeps = AppDeps & { stripe: Stripe };

/** The process-wide billing dependencies. */
export function billingDeps(): BillingDeps {
  return { ...app(), stripe: stripe() };
}
