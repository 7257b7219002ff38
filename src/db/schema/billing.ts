import { boolean, index, integer, pgEnum, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
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
  updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
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
    id: uuid().primaryKey().defaultRandom(),
    studioId: uuid()
      .notNull()
      .references(() => studios.id, { onDelete: 'cascade' }),
    userId: text()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    providerCustomerId: text(),
    providerSubscriptionId: text(),
    status: subscriptionStatusEnum().notNull().default('incomplete'),
    trialEnd: timestamp({ withTimezone: true }),
    currentPeriodEnd: timestamp({ withTimezone: true }),
    cancelAtPeriodEnd: boolean().notNull().default(false),
    pastDueSince: timestamp({ withTimezone: true }),
    promoCode: text(),
    /** Provider timestamp of the last event applied, so older events arriving late change nothing. */
    lastEventAt: timestamp({ withTimezone: true }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
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
    id: uuid().primaryKey().defaultRandom(),
    studioId: uuid()
      .notNull()
      .references(() => studios.id, { onDelete: 'cascade' }),
    code: text().notNull(),
    percentOff: integer().notNull(),
    expiresAt: timestamp({ withTimezone: true }),
    active: boolean().notNull().default(true),
    providerCouponId: text(),
    providerPromotionCodeId: text(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('promo_codes_studio_code_idx').on(t.studioId, t.code)],
);

/** Webhook events already handled (idempotency by the provider's event id). */
export const webhookEvents = pgTable('webhook_events', {
  id: text().primaryKey(),
  type: text().notNull(),
  receivedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
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
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('email_tokens_user_idx').on(t.userId)],
);

export const invitationRoleEnum = pgEnum('invitation_role', ['coach', 'editor']);

/** Staff invitations: the role is granted when the invitee accepts before expiry. */
export const invitations = pgTable(
  'invitations',
  {
    id: uuid().primaryKey().defaultRandom(),
    studioId: uuid()
      .notNull()
      .references(() => studios.id, { onDelete: 'cascade' }),
    email: text().notNull(),
    role: invitationRoleEnum().notNull(),
    tokenHash: text().notNull().unique(),
    invitedBy: text().references(() => users.id, { onDelete: 'set null' }),
    expiresAt: timestamp({ withTimezone: true }).notNull(),
    acceptedAt: timestamp({ withTimezone: true }),
    acceptedBy: text().references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
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
    studioId: uuid()
      .notNull()
      .references(() => studios.id, { onDelete: 'cascade' }),
    newClasses: boolean().notNull().default(false),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.studioId] })],
);

/** E-mails sent by scheduled jobs, so a reminder goes out once (e.g. "trial ends in 2 days"). */
export const sentNotices = pgTable(
  'sent_notices',
  {
    key: text().primaryKey(),
    sentAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
);
