import { bigserial, doublePrecision, index, integer, pgTable, real, text, uuid } from 'drizzle-orm/pg-core';
import { studioIdColumn, writtenAtColumn } from './columns';
import { recordings } from './recordings';

/** That a recording's audio was analysed (it may have no events), when, and by which analyser version. */
export const recordingAudioAnalyses = pgTable('recording_audio_analyses', {
  recordingId: uuid()
    .primaryKey()
    .references(() => recordings.id, { onDelete: 'cascade' }),
  studioId: studioIdColumn(),
  analyzerVersion: integer().notNull(),
  eventCount: integer().notNull(),
  /** Wall time of decode + analysis, for operations. */
  seconds: real().notNull(),
  analyzedAt: writtenAtColumn(),
});

/** Audio events heard in a recording (timer tones, whistles, speech, level changes). */
export const recordingEvents = pgTable(
  'recording_events',
  {
    id: bigserial({ mode: 'number' }).primaryKey(),
    recordingId: uuid()
      .notNull()
      .references(() => recordings.id, { onDelete: 'cascade' }),
    /** Double precision: real would round a time 20 minutes in to a quarter millisecond and worse later. */
    atSeconds: doublePrecision().notNull(),
    /** One of AUDIO_EVENT_KINDS (lib/audio/audio-events.ts); checked there, text here so new kinds need no migration. */
    kind: text().notNull(),
    strength: real().notNull(),
    durationSeconds: real().notNull(),
    frequencyHz: real(),
  },
  (t) => [index('recording_events_recording_idx').on(t.recordingId, t.atSeconds)],
);
