import { and, eq, sql } from 'drizzle-orm';
import { cues, lessons, segments } from '~/db/schema';
import type { Timeline } from '~/lib/timeline/timeline-schema';
import { AppError, notFound } from '../errors';
import type { AppDeps } from '../app';
import type { DbOrTx } from '../db';

export interface StoredTimeline extends Timeline {
  version: number;
}

const stale = (currentVersion: number) =>
  new AppError(
    'conflict',
    'Someone saved this timeline after you opened it. Nothing of yours was saved: compare with their version, then save again.',
    undefined,
    { currentVersion },
  );

/** Drops nulls from a stored row so optional fields stay absent, as the schema has them. */
function compact<T extends Record<string, unknown>>(row: T): T {
  return Object.fromEntries(Object.entries(row).filter(([, v]) => v !== null)) as T;
}

/** The draft timeline of a class: version 0 and no marks before the first save. */
export async function getTimeline(deps: AppDeps, studioId: string, lessonId: string): Promise<StoredTimeline> {
  return readTimeline(deps.db, studioId, lessonId);
}

/** The same read on a given connection, so a publish reads the timeline inside its transaction. */
export async function readTimeline(db: DbOrTx, studioId: string, lessonId: string): Promise<StoredTimeline> {
  const [lesson] = await db
    .select({ version: lessons.timelineVersion })
    .from(lessons)
    .where(and(eq(lessons.id, lessonId), eq(lessons.studioId, studioId)));
  if (!lesson) throw notFound('That class');
  const [segRows, cueRows] = await Promise.all([
    db
      .select({
        id: segments.id,
        kind: segments.kind,
        startSeconds: segments.startSeconds,
        endSeconds: segments.endSeconds,
        exercise: segments.exercise,
        round: segments.round,
        set: segments.set,
        title: segments.title,
        side: segments.side,
        format: segments.format,
      })
      .from(segments)
      .where(eq(segments.lessonId, lessonId))
      .orderBy(segments.startSeconds, segments.endSeconds),
    db
      .select({ id: cues.id, atSeconds: cues.atSeconds, kind: cues.kind, text: cues.text })
      .from(cues)
      .where(eq(cues.lessonId, lessonId))
      .orderBy(cues.atSeconds),
  ]);
  return { version: lesson.version, segments: segRows.map(compact) as Timeline['segments'], cues: cueRows };
}

/**
 * Replaces the whole timeline in one transaction when `version` is current; a stale version
 * answers 409 with the current version and changes nothing.
 */
export async function putTimeline(
  deps: AppDeps,
  studioId: string,
  lessonId: string,
  version: number,
  timeline: Timeline,
): Promise<{ version: number }> {
  return deps.db.transaction(async (tx) => {
    const [bumped] = await tx
      .update(lessons)
      .set({ timelineVersion: sql`${lessons.timelineVersion} + 1`, updatedAt: new Date() })
      .where(and(eq(lessons.id, lessonId), eq(lessons.studioId, studioId), eq(lessons.timelineVersion, version)))
      .returning({ version: lessons.timelineVersion });
    if (!bumped) {
      const [current] = await tx
        .select({ version: lessons.timelineVersion })
        .from(lessons)
        .where(and(eq(lessons.id, lessonId), eq(lessons.studioId, studioId)));
      if (!current) throw notFound('That class');
      throw stale(current.version);
    }
    await tx.delete(segments).where(eq(segments.lessonId, lessonId));
    await tx.delete(cues).where(eq(cues.lessonId, lessonId));
    // Chunked inserts keep each statement under PostgreSQL's 65,535-parameter limit.
    for (let i = 0; i < timeline.segments.length; i += 5000) {
      await tx.insert(segments).values(timeline.segments.slice(i, i + 5000).map((s) => ({ ...s, lessonId })));
    }
    for (let i = 0; i < timeline.cues.length; i += 10000) {
      await tx.insert(cues).values(timeline.cues.slice(i, i + 10000).map((c) => ({ ...c, lessonId })));
    }
    return { version: bumped.version };
  });
}
