/**
 * The parts of a payment provider's event that Roundmark reads, checked before anything is
 * applied. A correctly signed event can still be malformed (a provider bug, an API version we do
 * not expect, or a leaked signing secret); it answers 400 instead of failing halfway.
 * Unknown fields pass through untouched: providers add fields all the time.
 */
import { z } from 'zod';

const id = z.string().min(1).max(255);
const epochSeconds = z.number().int().nonnegative().max(253_402_300_799); // up to 9999-12-31
const metadata = z.record(z.string(), z.string()).nullish();
const idOrObject = z.union([id, z.looseObject({ id })]);

export const subscriptionObjectSchema = z.looseObject({
  object: z.literal('subscription').optional(),
  id,
  status: z.string().min(1).max(64),
  customer: idOrObject,
  metadata,
  trial_end: epochSeconds.nullish(),
  cancel_at_period_end: z.boolean().nullish(),
  cancel_at: epochSeconds.nullish(),
  items: z.looseObject({ data: z.array(z.looseObject({ current_period_end: epochSeconds.nullish() })) }).nullish(),
});

const checkoutSessionSchema = z.looseObject({
  mode: z.string().nullish(),
  subscription: z.union([id, subscriptionObjectSchema]).nullish(),
  client_reference_id: z.string().max(255).nullish(),
  metadata,
});

const invoiceSchema = z.looseObject({
  parent: z
    .looseObject({ subscription_details: z.looseObject({ subscription: idOrObject.nullish() }).nullish() })
    .nullish(),
});

const connectedAccountSchema = z.looseObject({
  object: z.literal('account').optional(),
  id,
  details_submitted: z.boolean().nullish(),
  charges_enabled: z.boolean().nullish(),
  payouts_enabled: z.boolean().nullish(),
});

/** `account` names the connected account an event happened on; absent, it is the platform's own. */
const envelope = <T extends z.ZodType>(type: z.ZodType<string>, object: T) =>
  z.looseObject({ id, type, created: epochSeconds, account: id.nullish(), data: z.looseObject({ object }) });

/** Events by type; any other type only needs a well-formed envelope (it is acknowledged and ignored). */
export const webhookEventSchema = z.union([
  envelope(z.literal('checkout.session.completed'), checkoutSessionSchema),
  envelope(z.enum(['customer.subscription.created', 'customer.subscription.updated', 'customer.subscription.deleted']), subscriptionObjectSchema),
  envelope(z.enum(['invoice.payment_failed', 'invoice.paid']), invoiceSchema),
  envelope(z.literal('account.updated'), connectedAccountSchema),
  envelope(
    z.string().min(1).max(255).refine((t) => !USED_TYPES.has(t)),
    z.looseObject({}),
  ),
]);

const USED_TYPES = new Set([
  'checkout.session.completed',
  'customer.subscription.created',
  'customer.subscription.updated',
  'customer.subscription.deleted',
  'invoice.payment_failed',
  'invoice.paid',
  'account.updated',
]);
