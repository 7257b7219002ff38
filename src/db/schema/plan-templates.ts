import { index, jsonb, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { sql } from 'drizzle-orm';
import { users } from './auth';
import { studios } from './studio';

/** A studio's own saved plans to start a class from (the built-in formats live in code). */
export const planTemplates = pgTable(
  'plan_templates',
  {
    id: uuid().primaryKey().defaultRandom(),
    studioId: uuid()
      .notNull()
      .references(() => studios.id, { onDelete: 'cascade' }),
    name: text().notNull(),
    /** A plan valid by `planSchema` when saved; parsed again when read. */
    plan: jsonb().notNull(),
    createdBy: text().references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex('plan_templates_studio_name_idx').on(t.studioId, sql`lower(${t.name})`),
    index('plan_templates_studio_idx').on(t.studioId),
  ],
);
