import { and, eq } from 'drizzle-orm';
import { coverFrames, lessons, recordings } from '~/db/schema';
import type { CoverFrameInput, CoverFrameOutput } from '~/lib/api/cover-schemas';
import { coverUrl } from '~/lib/publishing/cover';
import { coverFramePath, isInsideRecording } from '~/lib/publishing/cover-frame';
import { isRouteId } from '~/lib/api/route-params';
import { formatEditorTime } from '~/lib/time/format-time';
import { AppError, notFound } from '../errors';
import type { AppDeps } from '../app';

type FrameRow = typeof coverFrames.$inferSelect;

function frameOutput(row: FrameRow): CoverFrameOutput {
  return {
    id: row.id,
    atSeconds: row.atSeconds,
    state: row.state,
    message: row.state === 'failed' ? row.failureReason : null,
    coverUrl: row.state === 'done' ? coverUrl(row.recordingId, coverFramePath(row.id)) : null,
  };
}

/**
 * Queues a cover picture from a moment of the class's current recording. The moment is checked
 * against the recording's decoded length first: a time outside it is refused and nothing is
 * stored or queued.
 */
export async function requestCoverFrame(
  deps: AppDeps,
  studioId: string,
  lessonId: string,
  input: CoverFrameInput,
  userId: string | null,
): Promise<CoverFrameOutput> {
  const [row] = await deps.db
    .select({ lesson: lessons, rec: recordings })
    .from(lessons)
    .leftJoin(recordings, and(eq(recordings.id, lessons.currentRecordingId), eq(recordings.state, 'ready')))
    .where(and(eq(lessons.id, lessonId), eq(lessons.studioId, studioId)));
  if (!row) throw notFound('That class');
  const rec = row.rec;
  if (!rec || rec.durationSeconds === null) {
    throw new AppError('conflict', 'A frame can be the cover once the class has a ready recording: upload one first, or upload a picture.');
  }
  if (!isInsideRecording(input.atSeconds, rec.durationSeconds)) {
    const last = formatEditorTime(Math.max(0, rec.durationSeconds - 0.1));
    throw new AppError('invalid_input', `The recording is ${formatEditorTime(rec.durationSeconds)} long: there is no frame at ${formatEditorTime(input.atSeconds)}.`, {
      atSeconds: `Choose a moment from 0:00.0 to ${last}.`,
    });
  }
  const [frame] = await deps.db
    .insert(coverFrames)
    .values({ studioId, lessonId, recordingId: rec.id, atSeconds: input.atSeconds, createdBy: userId })
    .returning();
  await deps.jobs('cover.frame', { frameId: frame!.id }, `cover.frame:${frame!.id}`);
  return frameOutput(frame!);
}

/** How far one frame-as-cover request got (another class's or studio's request is not found). */
export async function getCoverFrame(deps: AppDeps, studioId: string, lessonId: string, frameId: string): Promise<CoverFrameOutput> {
  if (!isRouteId(frameId)) throw notFound('That cover picture');
  const [row] = await deps.db
    .select()
    .from(coverFrames)
    .where(and(eq(coverFrames.id, frameId), eq(coverFrames.lessonId, lessonId), eq(coverFrames.studioId, studioId)));
  if (!row) throw notFound('That cover picture');
  return frameOutput(row);
}
