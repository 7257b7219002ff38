import { timestamp, uuid } from 'drizzle-orm/pg-core';
import { studios } from './studio';

/**
 * Column shapes most tables share, written once. Each is a function: drizzle needs a fresh
 * builder per column. The studio reference is read lazily, so importing this from a table file
 * that studio.ts does not depend on is safe.
 */

/** A random UUID primary key. */
export const uuidPrimaryKey = () => uuid().primaryKey().defaultRandom();

/** The studio a row belongs to; deleting the studio deletes the row. */
export const studioIdColumn = () =>
  uuid()
    .notNull()
    .references(() => studios.id, { onDelete: 'cascade' });

/** A moment with its time zone, set to now when the row is written (created, updated, analysed…). */
export const writtenAtColumn = () => timestamp({ withTimezone: true }).notNull().defaultNow();
