import {
  boolean,
  doublePrecision,
  index,
  integer,
  jsonb,
  pgEnum,
  pgTable,
  primaryKey,
  real,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core';
import { studioIdColumn, uuidPrimaryKey, writtenAtColumn } from './columns';
import { sql } from 'drizzle-orm';
import { users } from './auth';

export const lessonStateEnum = pgEnum('lesson_state', ['draft', 'published', 'archived']);
export const impactEnum = pgEnum('impact_level', ['low', 'moderate', 'high']);
export const difficultyEnum = pgEnum('difficulty_level', ['beginner', 'intermediate', 'advanced']);

/** A recorded class ("class" is reserved in code). `version` guards against stale edits. */
export const lessons = pgTable(
  'lessons',
  {
    id: uuidPrimaryKey(),
    studioId: studioIdColumn(),
    coachId: text()
      .notNull()
      .references(() => users.id),
    slug: text().notNull(),
    title: text().notNull(),
    description: text().notNull().default(''),
    advertisedMinutes: integer().notNull(),
    mediaSeconds: real(),
    equipment: text().array().notNull().default(sql`'{}'::text[]`),
    impact: impactEnum().notNull().default('low'),
    focus: text().array().notNull().default(sql`'{}'::text[]`),
    difficulty: difficultyEnum().notNull().default('beginner'),
    cautions: text().notNull().default(''),
    state: lessonStateEnum().notNull().default('draft'),
    /** The class plan as JSON (src/lib/plan/plan-schema.ts); null until the coach writes one. */
    plan: jsonb(),
    /** Bumped by every timeline save; 0 means never saved. Stale saves answer 409. */
    timelineVersion: integer().notNull().default(0),
    /** The ready recording members watch; a new upload replaces it only once it is ready. */
    currentRecordingId: uuid(),
    /** The published version members see (latest publish); null while never published. */
    publishedVersionId: uuid(),
    /** A scheduled publish: done by the worker once due (and the recording is ready). */
    publishAt: timestamp({ withTimezone: true }),
    publishScheduledBy: text().references(() => users.id, { onDelete: 'set null' }),
    /** Whether whoever scheduled it acknowledged the check's warnings. */
    publishAcknowledgesWarnings: boolean().notNull().default(false),
    /** Title, description and exercise names of the published version, for full-text search. */
    searchDocument: text().notNull().default(''),
    /** Length of the published version in seconds (library length filters). */
    publishedSeconds: real(),
    /** When the version members see was published (library "newest"; copied so the listing needs no join). */
    publishedAt: timestamp({ withTimezone: true }),
    /** Length the library filters and sorts by: the published media, else the advertised minutes. */
    listedMinutes: doublePrecision().generatedAlwaysAs(
      sql`coalesce(published_seconds / 60.0, advertised_minutes::double precision)`,
    ),
    /**
     * The cover picture: a path inside the current recording's media folder (a chapter thumbnail
     * `chapters/{version}/{n}.jpg` or a made/uploaded `cover/{id}.jpg`); null until there is one.
     */
    coverPath: text(),
    /** Whether staff chose the cover; otherwise each publish sets the first work chapter's thumbnail. */
    coverChosen: boolean().notNull().default(false),
    /** An editor's hand-off: who marked the class ready for review, when, and their note; cleared by a publish. */
    reviewRequestedBy: text().references(() => users.id, { onDelete: 'set null' }),
    reviewRequestedAt: timestamp({ withTimezone: true }),
    reviewNote: text(),
    version: integer().notNull().default(1),
    createdAt: writtenAtColumn(),
    updatedAt: writtenAtColumn(),
  },
  (t) => [
    uniqueIndex('lessons_studio_slug_idx').on(t.studioId, t.slug),
    index('lessons_studio_state_idx').on(t.studioId, t.state),
    index('lessons_search_idx').using('gin', sql`to_tsvector('english', ${t.searchDocument})`),
    // The library listing: walks a studio's published classes newest first and stops after a
    // page. The migration adds INCLUDE (impact, difficulty, coach_id, listed_minutes) so the
    // count under common filters is an index-only scan (drizzle's builder has no INCLUDE).
    index('lessons_library_idx')
      .on(t.studioId, t.publishedAt.desc(), t.id)
      .where(sql`state = 'published' and published_version_id is not null`),
  ],
);

export const segmentKindEnum = pgEnum('segment_kind', [
  'intro',
  'warmup',
  'work',
  'rest',
  'round-break',
  'cooldown',
  'outro',
  'talk',
]);
/** A station done per side: which side this mark is. */
export const segmentSideEnum = pgEnum('segment_side', ['left', 'right']);
/** The timed format a work or rest mark belongs to, for its chapter and clock words. */
export const segmentFormatEnum = pgEnum('segment_format', ['amrap', 'emom']);
export const cueKindEnum = pgEnum('cue_kind', ['countdown', 'form', 'option', 'safety', 'note']);

/** Marked spans of a lesson's recording (the draft timeline). Ids come from the editor. */
export const segments = pgTable(
  'segments',
  {
    lessonId: uuid()
      .notNull()
      .references(() => lessons.id, { onDelete: 'cascade' }),
    id: text().notNull(),
    kind: segmentKindEnum().notNull(),
    startSeconds: doublePrecision().notNull(),
    endSeconds: doublePrecision().notNull(),
    exercise: text(),
    round: integer(),
    set: integer(),
    title: text(),
    side: segmentSideEnum(),
    format: segmentFormatEnum(),
  },
  (t) => [primaryKey({ columns: [t.lessonId, t.id] })],
);

/** Point-in-time coaching notes on a lesson's draft timeline. */
export const cues = pgTable(
  'cues',
  {
    lessonId: uuid()
      .notNull()
      .references(() => lessons.id, { onDelete: 'cascade' }),
    id: text().notNull(),
    atSeconds: doublePrecision().notNull(),
    kind: cueKindEnum().notNull(),
    text: text().notNull(),
  },
  (t) => [primaryKey({ columns: [t.lessonId, t.id] })],
);
