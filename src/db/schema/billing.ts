import { boolean, index, integer, pgEnum, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { studioIdColumn, uuidPrimaryKey, writtenAtColumn } from './columns';
import { users } from './auth';
import { studios } from './studio';

/** The studio's membership offer: monthly price and trial, and its ids at the payment provider. */
export const billingSettings = pgTable('billing_settings', {
  studioId: uuid()
    .primaryKey()
    .references(() => studios.id, { onDelete: 'cascade' }),
  currency: text().notNull().default('eur'),
  /** Monthly price in the currency's minor unit (cents). */
  monthlyPriceMinor: integer().notNull(),
  trialDays: integer().notNull().default(14),
  /** Grace days of watching while a payment is past due. */
  pastDueGraceDays: integer().notNull().default(3),
  providerProductId: text(),
  providerPriceId: text(),
  /** The connected account the product and price above live on (null: the platform's own, from before connected accounts). */
  providerAccountId: text(),
  updatedAt: writtenAtColumn(),
});

/**
 * The studio's own account at the payment provider ("connected account"): members pay the
 * studio there, and the platform keeps its application fee. The state is the provider's, copied
 * on every account.updated event and whenever the owner looks at the Payments section.
 */
export const paymentAccounts = pgTable('payment_accounts', {
  studioId: uuid()
    .primaryKey()
    .references(() => studios.id, { onDelete: 'cascade' }),
  providerAccountId: text().notNull().unique(),
  detailsSubmitted: boolean().notNull().default(false),
  chargesEnabled: boolean().notNull().default(false),
  payoutsEnabled: boolean().notNull().default(false),
  /** How many things the provider still needs from the owner (its requirements.currently_due). */
  requirementsDue: integer().notNull().default(0),
  createdAt: writtenAtColumn(),
  updatedAt: writtenAtColumn(),
});

export const subscriptionStatusEnum = pgEnum('subscription_status', [
  'incomplete',
  'trialing',
  'active',
  'past_due',
  'canceled',
  'unpaid',
  'incomplete_expired',
  'paused',
]);

/** A member's subscription as last reported by the payment provider's webhooks. */
export const subscriptions = pgTable(
  'subscriptions',
  {
    id: uuidPrimaryKey(),
    studioId: studioIdColumn(),
    userId: text()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    providerCustomerId: text(),
    providerSubscriptionId: text(),
    /** The connected account the customer and subscription live on (null: the platform's own). */
    providerAccountId: text(),
    status: subscriptionStatusEnum().notNull().default('incomplete'),
    trialEnd: timestamp({ withTimezone: true }),
    currentPeriodEnd: timestamp({ withTimezone: true }),
    cancelAtPeriodEnd: boolean().notNull().default(false),
    pastDueSince: timestamp({ withTimezone: true }),
    promoCode: text(),
    /** Provider timestamp of the last event applied, so older events arriving late change nothing. */
    lastEventAt: timestamp({ withTimezone: true }),
    createdAt: writtenAtColumn(),
    updatedAt: writtenAtColumn(),
  },
  (t) => [
    uniqueIndex('subscriptions_studio_user_idx').on(t.studioId, t.userId),
    uniqueIndex('subscriptions_provider_idx').on(t.providerSubscriptionId),
  ],
);

/** Promo codes the owner created (percent off the first month), mirrored at the provider. */
export const promoCodes = pgTable(
  'promo_codes',
  {
    id: uuidPrimaryKey(),
    studioId: studioIdColumn(),
    code: text().notNull(),
    percentOff: integer().notNull(),
    expiresAt: timestamp({ withTimezone: true }),
    active: boolean().notNull().default(true),
    providerCouponId: text(),
    providerPromotionCodeId: text(),
    /** The connected account the coupon and code live on (null: not mirrored there yet). */
    providerAccountId: text(),
    createdAt: writtenAtColumn(),
  },
  (t) => [uniqueIndex('promo_codes_studio_code_idx').on(t.studioId, t.code)],
);

/** Webhook events already handled (idempotency by the provider's event id). */
export const webhookEvents = pgTable('webhook_events', {
  id: text().primaryKey(),
  type: text().notNull(),
  receivedAt: writtenAtColumn(),
});

export const tokenPurposeEnum = pgEnum('token_purpose', ['verify-email', 'reset-password']);

/** Single-use e-mail tokens, stored hashed (SHA-256 of the token), with an expiry. */
export const emailTokens = pgTable(
  'email_tokens',
  {
    tokenHash: text().primaryKey(),
    userId: text()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    purpose: tokenPurposeEnum().notNull(),
    expiresAt: timestamp({ withTimezone: true }).notNull(),
    usedAt: timestamp({ withTimezone: true }),
    createdAt: writtenAtColumn(),
  },
  (t) => [index('email_tokens_user_idx').on(t.userId)],
);

export const invitationRoleEnum = pgEnum('invitation_role', ['coach', 'editor']);

/** Staff invitations: the role is granted when the invitee accepts before expiry. */
export const invitations = pgTable(
  'invitations',
  {
    id: uuidPrimaryKey(),
    studioId: studioIdColumn(),
    email: text().notNull(),
    role: invitationRoleEnum().notNull(),
    tokenHash: text().notNull().unique(),
    invitedBy: text().references(() => users.id, { onDelete: 'set null' }),
    expiresAt: timestamp({ withTimezone: true }).notNull(),
    acceptedAt: timestamp({ withTimezone: true }),
    acceptedBy: text().references(() => users.id, { onDelete: 'set null' }),
    createdAt: writtenAtColumn(),
  },
  (t) => [index('invitations_studio_idx').on(t.studioId)],
);

/** What e-mail a person wants from a studio beyond the necessary ones. */
export const emailPreferences = pgTable(
  'email_preferences',
  {
    userId: text()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    studioId: studioIdColumn(),
    newClasses: boolean().notNull().default(false),
    updatedAt: writtenAtColumn(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.studioId] })],
);

/** E-mails sent by scheduled jobs, so a reminder goes out once (e.g. "trial ends in 2 days"). */
export const sentNotices = pgTable(
  'sent_notices',
  {
    key: text().primaryKey(),
    sentAt: writtenAtColumn(),
  },
);
