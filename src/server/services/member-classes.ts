import { and, eq, sql } from 'drizzle-orm';
import { lessons, lessonVersions, playEvents, playProgress, users } from '~/db/schema';
import type { ProgressInput } from '~/lib/api/publish-schemas';
import { isFinished, mergeSpans, workSeconds, workWatchedSeconds } from '~/lib/publishing/finish-rule';
import { AppError, notFound } from '../errors';
import { hasEntitlement } from './entitlement';
import type { AppDeps } from '../app';
import type { VersionSnapshot } from './publishing';
import { coverUrl } from '~/lib/publishing/cover';

export interface PublishedClass {
  lessonId: string;
  slug: string;
  versionId: string;
  versionNumber: number;
  publishedAt: string;
  recordingId: string;
  /** The cover picture's link, or null while the class has none. */
  coverUrl: string | null;
  durationSeconds: number;
  snapshot: VersionSnapshot;
}

/** The latest published version of a class in the studio's library; anything else is not found. */
export async function publishedClass(deps: AppDeps, studioId: string, slug: string): Promise<PublishedClass> {
  const [row] = await deps.db
    .select({ lesson: lessons, version: lessonVersions })
    .from(lessons)
    .innerJoin(lessonVersions, eq(lessonVersions.id, lessons.publishedVersionId))
    .where(and(eq(lessons.studioId, studioId), eq(lessons.slug, slug), eq(lessons.state, 'published')));
  if (!row) throw notFound('That class');
  return {
    lessonId: row.lesson.id,
    slug: row.lesson.slug,
    versionId: row.version.id,
    versionNumber: row.version.number,
    publishedAt: row.version.publishedAt.toISOString(),
    recordingId: row.version.recordingId,
    coverUrl: coverUrl(row.lesson.currentRecordingId, row.lesson.coverPath),
    durationSeconds: row.version.durationSeconds,
    snapshot: row.version.snapshot as VersionSnapshot,
  };
}

/** The published version behind a class id (for progress reports). */
async function versionOfLesson(deps: AppDeps, studioId: string, lessonId: string) {
  const [row] = await deps.db
    .select({ version: lessonVersions })
    .from(lessons)
    .innerJoin(lessonVersions, eq(lessonVersions.id, lessons.publishedVersionId))
    .where(and(eq(lessons.id, lessonId), eq(lessons.studioId, studioId), eq(lessons.state, 'published')));
  if (!row) throw notFound('That class');
  return row.version;
}

/** Where the member stopped in a class, if anywhere. */
export async function progressOf(deps: AppDeps, userId: string, lessonId: string) {
  const [row] = await deps.db
    .select()
    .from(playProgress)
    .where(and(eq(playProgress.userId, userId), eq(playProgress.lessonId, lessonId)));
  return row ?? null;
}

/**
 * Records playback: position, watched spans (kept merged) and a raw event. A class counts as
 * finished once 90 % of its work intervals were watched (lib/publishing/finish-rule.ts).
 */
export async function recordProgress(deps: AppDeps, studioId: string, userId: string, lessonId: string, input: ProgressInput) {
  const version = await versionOfLesson(deps, studioId, lessonId);
  if (!(await hasEntitlement(deps, studioId, userId))) {
    throw new AppError('forbidden', 'Your membership is not active, so this class cannot be played. Start a free trial or subscribe on your account page.');
  }
  const { segments } = version.snapshot as VersionSnapshot;
  const clamp = (t: number) => Math.min(Math.max(0, t), version.durationSeconds);
  const reported = input.watched.map(([a, b]) => [clamp(a), clamp(b)] as [number, number]);
  return deps.db.transaction(async (tx) => {
    // Two first reports can race (a chapter jump and a pause on first play): a plain
    // "select, then insert" let both insert and one failed on the unique key. Creating the row
    // with ON CONFLICT DO NOTHING first makes the second wait for the first to commit; the row
    // lock below then serialises the merge, so every report's spans are kept.
    const inserted = await tx
      .insert(playProgress)
      .values({ userId, lessonId, versionId: version.id })
      .onConflictDoNothing({ target: [playProgress.userId, playProgress.lessonId] })
      .returning({ userId: playProgress.userId });
    const [row] = await tx
      .select()
      .from(playProgress)
      .where(and(eq(playProgress.userId, userId), eq(playProgress.lessonId, lessonId)))
      .for('update');
    const existing = inserted.length > 0 ? undefined : row;
    // A new published version starts the watched spans afresh (times may have moved).
    const earlier = existing && existing.versionId === version.id ? (existing.watchedSpans as [number, number][]) : [];
    const spans = mergeSpans([...earlier, ...reported]);
    const finishedNow = isFinished(segments, spans);
    const justFinished = finishedNow && !existing?.finishedAt;
    const values = {
      versionId: version.id,
      positionSeconds: clamp(input.positionSeconds),
      watchedSpans: spans,
      workWatchedSeconds: workWatchedSeconds(segments, spans),
      updatedAt: new Date(),
      ...(justFinished ? { finishedAt: new Date() } : {}),
    };
    await tx.update(playProgress).set(values).where(and(eq(playProgress.userId, userId), eq(playProgress.lessonId, lessonId)));
    await tx.insert(playEvents).values({
      userId,
      lessonId,
      versionId: version.id,
      kind: justFinished ? 'finish' : input.event,
      atSeconds: clamp(input.positionSeconds),
      fromSeconds: input.fromSeconds === undefined ? null : clamp(input.fromSeconds),
    });
    const watchedWork = values.workWatchedSeconds;
    return {
      positionSeconds: values.positionSeconds,
      finished: finishedNow || !!existing?.finishedAt,
      justFinished,
      summary: justFinished
        ? {
            watchedSeconds: spans.reduce((s, [a, b]) => s + (b - a), 0),
            workWatchedSeconds: watchedWork,
            workSeconds: workSeconds(segments),
            roundsDone: roundsDone(segments, spans),
          }
        : null,
    };
  });
}

/** Rounds whose work intervals were all at least 90 % watched. */
function roundsDone(segments: VersionSnapshot['segments'], spans: [number, number][]): number {
  const byRound = new Map<number, VersionSnapshot['segments']>();
  for (const s of segments) if (s.kind === 'work' && s.round) byRound.set(s.round, [...(byRound.get(s.round) ?? []), s]);
  let done = 0;
  for (const work of byRound.values()) if (isFinished(work, spans)) done++;
  return done;
}

/** Stores the member's acknowledgement of the general caution (shown before their first play). */
export async function acknowledgeCaution(deps: AppDeps, userId: string): Promise<void> {
  await deps.db.update(users).set({ cautionAcknowledgedAt: sql`coalesce(${users.cautionAcknowledgedAt}, now())` }).where(eq(users.id, userId));
}

/** Whether the member acknowledged the caution. */
export async function cautionAcknowledged(deps: AppDeps, userId: string): Promise<boolean> {
  const [row] = await deps.db.select({ at: users.cautionAcknowledgedAt }).from(users).where(eq(users.id, userId));
  return !!row?.at;
}

/** The WebVTT chapters file stored with a published version. */
export async function chaptersVttOf(deps: AppDeps, versionId: string): Promise<string> {
  const [v] = await deps.db.select({ vtt: lessonVersions.chaptersVtt }).from(lessonVersions).where(eq(lessonVersions.id, versionId));
  if (!v) throw notFound('That class');
  return v.vtt;
}
