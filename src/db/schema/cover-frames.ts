import { pgEnum, pgTable, real, text, uuid, index } from 'drizzle-orm/pg-core';
import { studioIdColumn, uuidPrimaryKey, writtenAtColumn } from './columns';
import { users } from './auth';
import { lessons } from './lessons';
import { recordings } from './recordings';
import { COVER_FRAME_STATES } from '../../lib/publishing/cover-frame';

export const coverFrameStateEnum = pgEnum('cover_frame_state', COVER_FRAME_STATES);

/**
 * One "use this frame as cover" request: the moment of the recording staff paused at, and how far
 * the worker got with it. Its id names the picture it makes (`cover/{id}.jpg`), so a retried job
 * overwrites the same object.
 */
export const coverFrames = pgTable(
  'cover_frames',
  {
    id: uuidPrimaryKey(),
    studioId: studioIdColumn(),
    lessonId: uuid()
      .notNull()
      .references(() => lessons.id, { onDelete: 'cascade' }),
    recordingId: uuid()
      .notNull()
      .references(() => recordings.id, { onDelete: 'cascade' }),
    atSeconds: real().notNull(),
    state: coverFrameStateEnum().notNull().default('waiting'),
    /** What went wrong, in words staff can act on; set only when failed. */
    failureReason: text(),
    createdBy: text().references(() => users.id, { onDelete: 'set null' }),
    createdAt: writtenAtColumn(),
    updatedAt: writtenAtColumn(),
  },
  (t) => [index('cover_frames_lesson_idx').on(t.lessonId)],
);
