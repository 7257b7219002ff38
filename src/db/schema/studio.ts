import { index, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { sql } from 'drizzle-orm';
import { users } from './auth';

export const roleEnum = pgEnum('studio_role', ['owner', 'coach', 'editor', 'member']);

export const studios = pgTable('studios', {
  id: uuid().primaryKey().defaultRandom(),
  slug: text().notNull().unique(),
  name: text().notNull(),
  /** IANA zone the studio's dates and scheduled publishes are read in. */
  timeZone: text().notNull().default('UTC'),
  /** BCP 47 locale for dates and numbers on the studio's pages and e-mails. */
  locale: text().notNull().default('en-GB'),
  /** Behind button and badge text on the studio's pages; white or ink text on it reaches 4.5:1 (lib/studios/studio-rules.ts). */
  accentColour: text().notNull().default('#B93A17'),
  /** File name of the studio's logo in the object store (lib/studios/studio-logo.ts), or null; a new name on every upload. */
  logoFile: text(),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});

/** Addresses a studio used before: old links redirect to its current slug, and nobody else may take them. */
export const studioSlugRedirects = pgTable('studio_slug_redirects', {
  slug: text().primaryKey(),
  studioId: uuid()
    .notNull()
    .references(() => studios.id, { onDelete: 'cascade' }),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});

/** A person's roles in a studio; one row per role (an owner may also coach). */
export const memberships = pgTable(
  'memberships',
  {
    id: uuid().primaryKey().defaultRandom(),
    userId: text()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    studioId: uuid()
      .notNull()
      .references(() => studios.id, { onDelete: 'cascade' }),
    role: roleEnum().notNull(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex('memberships_user_studio_role_idx').on(t.userId, t.studioId, t.role),
    index('memberships_studio_idx').on(t.studioId),
  ],
);

/** The studio's own list of moves; plan stations and work segments name them. */
export const exercises = pgTable(
  'exercises',
  {
    id: uuid().primaryKey().defaultRandom(),
    studioId: uuid()
      .notNull()
      .references(() => studios.id, { onDelete: 'cascade' }),
    name: text().notNull(),
    focus: text(),
    equipment: text().array().notNull().default(sql`'{}'::text[]`),
    cautions: text(),
    easierOption: text(),
    harderOption: text(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('exercises_studio_name_idx').on(t.studioId, sql`lower(${t.name})`)],
);
