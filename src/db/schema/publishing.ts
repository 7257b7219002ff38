import { boolean, index, integer, jsonb, pgEnum, pgTable, real, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { uuidPrimaryKey, writtenAtColumn } from './columns';
import { users } from './auth';
import { lessons } from './lessons';
import { recordings } from './recordings';

/**
 * An immutable published version of a class: what members watch while the coach keeps editing
 * the draft. Never updated or deleted once written (members' history refers to it).
 */
export const lessonVersions = pgTable(
  'lesson_versions',
  {
    id: uuidPrimaryKey(),
    lessonId: uuid()
      .notNull()
      .references(() => lessons.id, { onDelete: 'cascade' }),
    number: integer().notNull(),
    recordingId: uuid()
      .notNull()
      .references(() => recordings.id),
    /** Details, plan, segments, cues and check summary as published. */
    snapshot: jsonb().notNull(),
    /** The WebVTT chapters file of this version. */
    chaptersVtt: text().notNull(),
    durationSeconds: real().notNull(),
    warningsAcknowledged: boolean().notNull().default(false),
    publishedBy: text().references(() => users.id, { onDelete: 'set null' }),
    publishedAt: writtenAtColumn(),
  },
  (t) => [uniqueIndex('lesson_versions_lesson_number_idx').on(t.lessonId, t.number)],
);

export const playEventKindEnum = pgEnum('play_event_kind', ['start', 'progress', 'seek', 'chapter', 'leave', 'finish']);

/** Raw playback events, kept so later questions about drop-off can be answered. */
export const playEvents = pgTable(
  'play_events',
  {
    id: uuidPrimaryKey(),
    userId: text()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    lessonId: uuid()
      .notNull()
      .references(() => lessons.id, { onDelete: 'cascade' }),
    versionId: uuid()
      .notNull()
      .references(() => lessonVersions.id),
    kind: playEventKindEnum().notNull(),
    atSeconds: real().notNull(),
    fromSeconds: real(),
    createdAt: writtenAtColumn(),
  },
  (t) => [index('play_events_lesson_idx').on(t.lessonId, t.createdAt)],
);

/** Where each member is in each class, and whether they finished it. */
export const playProgress = pgTable(
  'play_progress',
  {
    userId: text()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    lessonId: uuid()
      .notNull()
      .references(() => lessons.id, { onDelete: 'cascade' }),
    versionId: uuid()
      .notNull()
      .references(() => lessonVersions.id),
    positionSeconds: real().notNull().default(0),
    /** Seconds of work intervals watched (union of watched spans, for the finish rule). */
    workWatchedSeconds: real().notNull().default(0),
    watchedSpans: jsonb().notNull().default([]),
    startedAt: writtenAtColumn(),
    updatedAt: writtenAtColumn(),
    finishedAt: timestamp({ withTimezone: true }),
  },
  (t) => [uniqueIndex('play_progress_user_lesson_idx').on(t.userId, t.lessonId)],
);
