/**
 * Audio events of recordings: the one writer of recording_events and recording_audio_analyses,
 * the paged listing, and the "Mark it for me" proposal built from them.
 */
import { and, asc, count, eq, sql } from 'drizzle-orm';
import { recordingAudioAnalyses, recordingEvents, recordings } from '~/db/schema';
import { AUDIO_EVENT_KINDS, type AudioEvent, type AudioEventKind } from '~/lib/audio/audio-events';
import type { ProposalOutput, RecordingEventsOutput } from '~/lib/api/marking-schemas';
import { proposeTimeline, REVIEW_BELOW } from '~/lib/marking/propose-timeline';
import type { AppDeps } from '../app';
import type { Db, DbOrTx } from '../db';
import { AppError, notFound } from '../errors';
import { loadClass } from './class-check';

/** Bumped when the analysis changes enough that stored events should be recomputed. */
export const ANALYZER_VERSION = 1;

const INSERT_BATCH = 1000;

/** Replaces a recording's events in one transaction (a retried job overwrites, never duplicates). */
export async function storeRecordingEvents(
  db: Db,
  recording: { id: string; studioId: string },
  events: readonly AudioEvent[],
  seconds: number,
): Promise<void> {
  await db.transaction(async (tx) => {
    await tx.delete(recordingEvents).where(eq(recordingEvents.recordingId, recording.id));
    for (let i = 0; i < events.length; i += INSERT_BATCH) {
      await tx.insert(recordingEvents).values(
        events.slice(i, i + INSERT_BATCH).map((e) => ({
          recordingId: recording.id,
          atSeconds: e.atSeconds,
          kind: e.kind,
          strength: e.strength,
          durationSeconds: e.durationSeconds,
          frequencyHz: e.frequencyHz ?? null,
        })),
      );
    }
    const row = { studioId: recording.studioId, analyzerVersion: ANALYZER_VERSION, eventCount: events.length, seconds, analyzedAt: new Date() };
    await tx
      .insert(recordingAudioAnalyses)
      .values({ recordingId: recording.id, ...row })
      .onConflictDoUpdate({ target: recordingAudioAnalyses.recordingId, set: row });
  });
}

/** Ready recordings with audio whose events are missing or from an older analyser (for the one-off job at start). */
export async function recordingsWithoutEvents(db: DbOrTx, limit = 1000): Promise<{ id: string }[]> {
  return db
    .select({ id: recordings.id })
    .from(recordings)
    .leftJoin(recordingAudioAnalyses, eq(recordingAudioAnalyses.recordingId, recordings.id))
    .where(
      and(
        eq(recordings.state, 'ready'),
        sql`${recordings.hasAudio} is not false`,
        sql`(${recordingAudioAnalyses.recordingId} is null or ${recordingAudioAnalyses.analyzerVersion} < ${ANALYZER_VERSION})`,
      ),
    )
    .limit(limit);
}

/** One page of a recording's events, ordered by time. Another studio's recording answers 404. */
export async function listRecordingEvents(
  deps: Pick<AppDeps, 'db'>,
  studioId: string,
  recordingId: string,
  page: { offset: number; limit: number },
): Promise<RecordingEventsOutput> {
  const [rec] = await deps.db
    .select({ id: recordings.id, analyzed: recordingAudioAnalyses.recordingId })
    .from(recordings)
    .leftJoin(recordingAudioAnalyses, eq(recordingAudioAnalyses.recordingId, recordings.id))
    .where(and(eq(recordings.id, recordingId), eq(recordings.studioId, studioId)));
  if (!rec) throw notFound('That recording');
  const [{ total } = { total: 0 }] = await deps.db.select({ total: count() }).from(recordingEvents).where(eq(recordingEvents.recordingId, recordingId));
  const rows = await readEvents(deps.db, recordingId, page);
  const next = page.offset + rows.length;
  return { recordingId, analyzed: rec.analyzed !== null, total, events: rows, nextOffset: next < total ? next : null };
}

async function readEvents(db: DbOrTx, recordingId: string, page?: { offset: number; limit: number }): Promise<AudioEvent[]> {
  const query = db
    .select({
      atSeconds: recordingEvents.atSeconds,
      kind: recordingEvents.kind,
      strength: recordingEvents.strength,
      durationSeconds: recordingEvents.durationSeconds,
      frequencyHz: recordingEvents.frequencyHz,
    })
    .from(recordingEvents)
    .where(eq(recordingEvents.recordingId, recordingId))
    .orderBy(asc(recordingEvents.atSeconds), asc(recordingEvents.id));
  const rows = page ? await query.offset(page.offset).limit(page.limit) : await query;
  return rows
    .filter((r) => (AUDIO_EVENT_KINDS as readonly string[]).includes(r.kind))
    .map((r) => ({
      atSeconds: r.atSeconds,
      kind: r.kind as AudioEventKind,
      strength: r.strength,
      durationSeconds: r.durationSeconds,
      ...(r.frequencyHz !== null ? { frequencyHz: r.frequencyHz } : {}),
    }));
}

/**
 * "Mark it for me": a proposed timeline for the class from its plan and its current recording's
 * audio events. Nothing is saved; the editor saves an accepted proposal through the timeline PUT.
 */
export async function proposeClassTimeline(deps: Pick<AppDeps, 'db'>, studioId: string, lessonId: string): Promise<ProposalOutput> {
  const loaded = await loadClass(deps.db, studioId, lessonId);
  if (!loaded.plan) {
    throw new AppError('unprocessable', 'This class has no plan yet. "Mark it for me" places the plan’s parts on the recording: add the plan first.');
  }
  if (!loaded.recording?.ready || !loaded.recording.durationSeconds) {
    throw new AppError('conflict', 'This class has no ready recording yet. Upload the recording and wait until it has been processed, then press "Mark it for me" again.');
  }
  const recordingId = loaded.recording.id;
  const [analysis] = await deps.db
    .select({ id: recordingAudioAnalyses.recordingId })
    .from(recordingAudioAnalyses)
    .where(eq(recordingAudioAnalyses.recordingId, recordingId));
  if (!analysis) {
    throw new AppError('conflict', 'The recording’s sounds are still being analysed. Try again in a minute.');
  }
  const events = await readEvents(deps.db, recordingId);
  const proposal = proposeTimeline(loaded.plan, events, loaded.recording.durationSeconds);
  return { ...proposal, reviewBelow: REVIEW_BELOW, recordingId };
}
