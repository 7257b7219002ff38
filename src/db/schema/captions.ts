import { boolean, integer, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { users } from './auth';
import { lessons } from './lessons';

/**
 * The draft captions of a class (one row per class once captions were saved). The cues are one
 * list that is always saved whole, so they live in one `jsonb` value checked by
 * `captionCuesSchema`; `version` makes a stale save answer 409 like every other class write.
 * Removing all captions keeps the row (with no cues) so the version keeps counting.
 */
export const lessonCaptions = pgTable('lesson_captions', {
  lessonId: uuid()
    .primaryKey()
    .references(() => lessons.id, { onDelete: 'cascade' }),
  version: integer().notNull(),
  language: text().notNull(),
  label: text().notNull(),
  cues: jsonb().notNull(),
  updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});

/** What the member's player remembers for them across devices (captions on or off). */
export const playerPreferences = pgTable('player_preferences', {
  userId: text()
    .primaryKey()
    .references(() => users.id, { onDelete: 'cascade' }),
  captionsOn: boolean().notNull().default(false),
  updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});
