import { z } from 'zod';
import { noControlCharacters } from './text-rules';

/** A promo code as people type it: spaces trimmed, upper-cased, letters, digits and dashes. */
export const promoCodeField = z
  .string()
  .trim()
  .toUpperCase()
  .pipe(
    z
      .string()
      .min(3, { error: 'A code has at least 3 characters.' })
      .max(24, { error: 'A code has at most 24 characters.' })
      .regex(/^[A-Z0-9-]+$/, { error: 'Use only letters, digits and dashes in a code.' }),
  );

export const checkoutInput = z
  .object({
    /** Optional promo code; an empty field means none. */
    promoCode: z
      .union([z.literal(''), promoCodeField])
      .optional()
      .transform((v) => v || undefined),
  })
  .meta({ id: 'CheckoutInput' });
export type CheckoutInput = z.infer<typeof checkoutInput>;

export const checkoutOutput = z.object({ url: z.string().url().describe('The hosted payment page to send the member to') }).meta({ id: 'CheckoutOutput' });

export const SUBSCRIPTION_STATUSES = ['incomplete', 'trialing', 'active', 'past_due', 'canceled', 'unpaid', 'incomplete_expired', 'paused'] as const;

export const membershipOutput = z
  .object({
    status: z.enum([...SUBSCRIPTION_STATUSES, 'none']),
    trialEnd: z.string().nullable(),
    currentPeriodEnd: z.string().nullable(),
    cancelAtPeriodEnd: z.boolean(),
    promoCode: z.string().nullable(),
    entitled: z.boolean(),
  })
  .meta({ id: 'Membership' });
export type MembershipOutput = z.infer<typeof membershipOutput>;

export const billingSettingsOutput = z
  .object({
    currency: z.string(),
    monthlyPriceMinor: z.number().int().describe('Monthly price in cents'),
    trialDays: z.number().int(),
    pastDueGraceDays: z.number().int(),
    version: z.string().nullable().describe('Send back with PUT; a stale one answers 409'),
  })
  .meta({ id: 'BillingSettings' });

export const billingSettingsInput = z
  .object({
    monthlyPriceMinor: z
      .number({ error: 'Enter the monthly price.' })
      .int({ error: 'Enter the price in whole cents.' })
      .min(100, { error: 'The monthly price is at least 1.00.' })
      .max(100_000, { error: 'The monthly price is at most 1,000.00.' }),
    trialDays: z.number({ error: 'Enter the trial length in days.' }).int().min(0, { error: 'Use 0 for no trial.' }).max(90, { error: 'A trial lasts at most 90 days.' }),
    pastDueGraceDays: z.number().int().min(0).max(30, { error: 'Grace lasts at most 30 days.' }).default(3),
    version: z.string().max(64).regex(...noControlCharacters('The version')).nullable(),
  })
  .meta({ id: 'BillingSettingsInput' });
export type BillingSettingsInput = z.infer<typeof billingSettingsInput>;

export const promoCreateInput = z
  .object({
    code: promoCodeField,
    percentOff: z
      .number({ error: 'Enter the percent off.' })
      .int({ error: 'Use a whole percent.' })
      .min(1, { error: 'The discount is at least 1 %.' })
      .max(100, { error: 'The discount is at most 100 %.' }),
    expiresAt: z.iso.datetime({ offset: true, error: 'Enter a date and time for the expiry, or leave it empty.' }).nullable().optional(),
  })
  .meta({ id: 'PromoCodeInput' });
export type PromoCreateInput = z.infer<typeof promoCreateInput>;

export const promoPatchInput = z.object({ active: z.boolean({ error: 'Say whether the code is active.' }) }).meta({ id: 'PromoCodePatch' });

export const promoOutput = z
  .object({
    id: z.string().uuid(),
    code: z.string(),
    percentOff: z.number().int(),
    expiresAt: z.string().nullable(),
    active: z.boolean(),
    state: z.enum(['active', 'expired', 'inactive']),
    redemptions: z.number().int(),
    createdAt: z.string(),
  })
  .meta({ id: 'PromoCode' });

export const MEMBER_SORTS = ['name', 'email', 'status', 'since', 'trialEnd'] as const;
/**
 * A query choice where an unknown value falls back to the default (an old bookmark keeps working).
 * Written as a preprocess rather than `.catch()` so the OpenAPI generator can still show the enum.
 */
const lenientChoice = <const T extends readonly [string, ...string[]]>(values: T, fallback: T[number]) =>
  z.preprocess((v) => ((values as readonly unknown[]).includes(v) ? v : undefined), z.enum(values).default(fallback));

export const membersQuery = z.object({
  q: z.string().trim().max(100).regex(...noControlCharacters('The search')).optional().transform((v) => v || undefined).describe('Search in name and e-mail'),
  sort: lenientChoice(MEMBER_SORTS, 'name'),
  dir: lenientChoice(['asc', 'desc'], 'asc'),
  format: lenientChoice(['json', 'csv'], 'json'),
});
export type MembersQuery = z.infer<typeof membersQuery>;

export const memberRow = z
  .object({
    userId: z.string(),
    name: z.string(),
    email: z.string(),
    status: z.enum([...SUBSCRIPTION_STATUSES, 'none']),
    since: z.string().nullable(),
    trialEnd: z.string().nullable(),
    promoCode: z.string().nullable(),
  })
  .meta({ id: 'MemberRow' });
export type MemberRow = z.infer<typeof memberRow>;

export const memberListOutput = z.object({ members: z.array(memberRow) }).meta({ id: 'Members' });
export const promoListOutput = z.object({ promoCodes: z.array(promoOutput) }).meta({ id: 'PromoCodes' });

/** The payment provider's signature header on a webhook. */
export const webhookHeaders = z.object({ 'stripe-signature': z.string().describe('t=<unix time>,v1=<HMAC-SHA256 of "t.payload">') });
/** A webhook event as the provider sends it: we read its id and type; the rest stays as sent. */
export const webhookEventInput = z.object({ id: z.string(), type: z.string() }).passthrough();
export const webhookReceivedOutput = z
  .object({ received: z.literal(true), applied: z.boolean(), reason: z.string().optional() })
  .meta({ id: 'WebhookReceived' });
/** `GET /api/billing/members?format=csv`: the same table as a CSV file with a header row. */
export const membersCsvText = z.string().describe('CSV with a header row; cells that could start a formula are neutralised');

/** The studio's own payment account (owner): where it stands and the platform's fee. */
export const paymentAccountOutput = z
  .object({
    state: z.enum(['none', 'onboarding', 'restricted', 'ready']).describe('none: not connected; onboarding: setup not finished; restricted: the provider needs more; ready: members can pay'),
    accountId: z.string().nullable().describe('The connected account at the payment provider'),
    detailsSubmitted: z.boolean(),
    chargesEnabled: z.boolean().describe('Members can pay (memberships can be sold)'),
    payoutsEnabled: z.boolean().describe('The provider pays out to the studio’s bank account'),
    requirementsDue: z.number().int().describe('How many things the provider still needs from the owner'),
    feePercent: z.number().describe('The platform’s application fee, in percent of each payment'),
  })
  .meta({ id: 'PaymentAccount' });

export const onboardingLinkOutput = z
  .object({ url: z.string().url().describe('The payment provider’s onboarding page; single use, valid a few minutes') })
  .meta({ id: 'PaymentOnboardingLink' });
