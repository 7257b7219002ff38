import { index, jsonb, pgTable, text, uniqueIndex } from 'drizzle-orm/pg-core';
import { studioIdColumn, uuidPrimaryKey, writtenAtColumn } from './columns';
import { sql } from 'drizzle-orm';
import { users } from './auth';

/** A studio's own saved plans to start a class from (the built-in formats live in code). */
export const planTemplates = pgTable(
  'plan_templates',
  {
    id: uuidPrimaryKey(),
    studioId: studioIdColumn(),
    name: text().notNull(),
    /** A plan valid by `planSchema` when saved; parsed again when read. */
    plan: jsonb().notNull(),
    createdBy: text().references(() => users.id, { onDelete: 'set null' }),
    createdAt: writtenAtColumn(),
  },
  (t) => [
    uniqueIndex('plan_templates_studio_name_idx').on(t.studioId, sql`lower(${t.name})`),
    index('plan_templates_studio_idx').on(t.studioId),
  ],
);
