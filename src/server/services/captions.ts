import { and, eq, sql } from 'drizzle-orm';
import { lessonCaptions, lessons, playerPreferences, recordings } from '~/db/schema';
import { captionCuesSchema, captionsPastRecording, type CaptionsOutput, type CaptionsPut, type PublishedCaptions } from '~/lib/captions/caption-schema';
import { AppError, notFound } from '../errors';
import type { AppDeps } from '../app';
import type { DbOrTx } from '../db';

const DEFAULT_TRACK = { language: 'en', label: 'English captions' };

const stale = (currentVersion: number) =>
  new AppError(
    'conflict',
    'Someone saved these captions after you opened them. Nothing of yours was saved: reload to see their version, then make your change again.',
    undefined,
    { currentVersion },
  );

/** The class (of this studio) and the length of its current ready recording, or 404. */
async function classAndRecording(db: DbOrTx, studioId: string, lessonId: string): Promise<{ recordingSeconds: number | null }> {
  const [row] = await db
    .select({ id: lessons.id, state: recordings.state, durationSeconds: recordings.durationSeconds })
    .from(lessons)
    .leftJoin(recordings, eq(recordings.id, lessons.currentRecordingId))
    .where(and(eq(lessons.id, lessonId), eq(lessons.studioId, studioId)));
  if (!row) throw notFound('That class');
  return { recordingSeconds: row.state === 'ready' && row.durationSeconds ? row.durationSeconds : null };
}

/** The draft captions of a class: version 0 and no cues before the first save. */
export async function getCaptions(deps: AppDeps, studioId: string, lessonId: string): Promise<CaptionsOutput> {
  const { recordingSeconds } = await classAndRecording(deps.db, studioId, lessonId);
  const [row] = await deps.db.select().from(lessonCaptions).where(eq(lessonCaptions.lessonId, lessonId));
  if (!row) return { version: 0, ...DEFAULT_TRACK, cues: [], recordingSeconds };
  return { version: row.version, language: row.language, label: row.label, cues: captionCuesSchema.parse(row.cues), recordingSeconds };
}

/**
 * Replaces the captions when `version` is current (0 = none saved yet); a stale version answers
 * 409 and changes nothing. Captions must end within the current recording, so a class needs a
 * ready recording before it gets captions.
 */
export async function putCaptions(deps: AppDeps, studioId: string, lessonId: string, input: CaptionsPut): Promise<{ version: number; cues: number }> {
  return deps.db.transaction(async (tx) => {
    const { recordingSeconds } = await classAndRecording(tx, studioId, lessonId);
    if (input.cues.length > 0) {
      if (recordingSeconds === null) {
        throw new AppError('unprocessable', 'Captions are timed against the recording: upload the recording and wait until it is ready, then add the captions.');
      }
      const past = captionsPastRecording(input.cues, recordingSeconds);
      const first = Object.values(past)[0];
      if (first) throw new AppError('invalid_input', `${first} Nothing was saved.`, past);
    }
    const values = { language: input.language, label: input.label, cues: input.cues, updatedAt: new Date() };
    const saved =
      input.version === 0
        ? await tx.insert(lessonCaptions).values({ lessonId, version: 1, ...values }).onConflictDoNothing().returning({ version: lessonCaptions.version })
        : await tx
            .update(lessonCaptions)
            .set({ ...values, version: sql`${lessonCaptions.version} + 1` })
            .where(and(eq(lessonCaptions.lessonId, lessonId), eq(lessonCaptions.version, input.version)))
            .returning({ version: lessonCaptions.version });
    if (!saved[0]) {
      const [current] = await tx.select({ version: lessonCaptions.version }).from(lessonCaptions).where(eq(lessonCaptions.lessonId, lessonId));
      throw stale(current?.version ?? 0);
    }
    return { version: saved[0].version, cues: input.cues.length };
  });
}

/** The captions a publish snapshots (inside its transaction); none when the class has no cues. */
export async function captionsToPublish(tx: DbOrTx, lessonId: string): Promise<PublishedCaptions | undefined> {
  const [row] = await tx.select().from(lessonCaptions).where(eq(lessonCaptions.lessonId, lessonId));
  const cues = row ? captionCuesSchema.parse(row.cues) : [];
  return row && cues.length > 0 ? { language: row.language, label: row.label, cues } : undefined;
}

/** How many draft captions end after a recording of this length (publishing waits until none do). */
export async function captionsPastEnd(db: DbOrTx, lessonId: string, recordingSeconds: number): Promise<number> {
  const [row] = await db.select({ cues: lessonCaptions.cues }).from(lessonCaptions).where(eq(lessonCaptions.lessonId, lessonId));
  return row ? Object.keys(captionsPastRecording(captionCuesSchema.parse(row.cues), recordingSeconds)).length : 0;
}

/** Whether the member turned captions on last time (off until they do). */
export async function captionsPreference(deps: AppDeps, userId: string): Promise<boolean> {
  const [row] = await deps.db.select({ on: playerPreferences.captionsOn }).from(playerPreferences).where(eq(playerPreferences.userId, userId));
  return row?.on ?? false;
}

/** Remembers the member's captions choice for every device they play on. */
export async function putCaptionsPreference(deps: AppDeps, userId: string, captionsOn: boolean): Promise<void> {
  await deps.db
    .insert(playerPreferences)
    .values({ userId, captionsOn })
    .onConflictDoUpdate({ target: playerPreferences.userId, set: { captionsOn, updatedAt: new Date() } });
}
