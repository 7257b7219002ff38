import { bigint, index, integer, pgTable, text, timestamp, uniqueIndex, uuid, varchar, type AnyPgColumn } from 'drizzle-orm/pg-core';
import { writtenAtColumn } from './columns';
import { studios } from './studio';
import { sql } from 'drizzle-orm';

/** People who sign in. E-mail is stored lower-cased; uniqueness is case-insensitive. */
export const users = pgTable(
  'users',
  {
    id: text().primaryKey(),
    email: text().notNull(),
    name: text().notNull(),
    passwordHash: text().notNull(),
    emailVerifiedAt: timestamp({ withTimezone: true }),
    createdAt: writtenAtColumn(),
    passwordChangedAt: timestamp({ withTimezone: true }),
    /** When the member acknowledged the general exercise caution before their first play. */
    cautionAcknowledgedAt: timestamp({ withTimezone: true }),
  },
  (t) => [uniqueIndex('users_email_lower_idx').on(sql`lower(${t.email})`)],
);

/** lucia's session table: one row per signed-in browser. */
export const sessions = pgTable(
  'sessions',
  {
    id: text().primaryKey(),
    userId: text()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    expiresAt: timestamp({ withTimezone: true, mode: 'date' }).notNull(),
    /** The studio staff pages work on in this session, chosen by the person (a studio they belong to). */
    currentStudioId: uuid().references((): AnyPgColumn => studios.id, { onDelete: 'set null' }),
  },
  (t) => [index('sessions_user_idx').on(t.userId)],
);

/**
 * Counters for rate-limiter-flexible's PostgreSQL store (failed sign-ins per account and per
 * address). Column names and types are the ones that package expects.
 */
export const rateLimits = pgTable('rate_limits', {
  key: varchar({ length: 255 }).primaryKey(),
  points: integer().notNull().default(0),
  expire: bigint({ mode: 'number' }),
});
