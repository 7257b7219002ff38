import { and, eq, inArray } from 'drizzle-orm';
import { lessons, lessonVersions, playEvents, playProgress } from '~/db/schema';
import { classInsights, type ClassInsights } from '~/lib/publishing/insights';
import { notFound } from '../errors';
import type { AppDeps } from '../app';
import type { VersionSnapshot } from './publishing';

/** Insights of a class's latest published version (starts, finishes, drop-off and skips by chapter), recomputed from the stored progress rows and raw play events on every view. */
export async function lessonInsights(deps: AppDeps, studioId: string, lessonId: string): Promise<(ClassInsights & { versionNumber: number }) | null> {
  const [row] = await deps.db
    .select({ version: lessonVersions })
    .from(lessons)
    .leftJoin(lessonVersions, eq(lessonVersions.id, lessons.publishedVersionId))
    .where(and(eq(lessons.id, lessonId), eq(lessons.studioId, studioId)));
  if (!row) throw notFound('That class');
  if (!row.version) return null;
  const { chapters } = row.version.snapshot as VersionSnapshot;
  const [progress, jumps] = await Promise.all([
    deps.db.select().from(playProgress).where(and(eq(playProgress.lessonId, lessonId), eq(playProgress.versionId, row.version.id))),
    deps.db
      .select({ userId: playEvents.userId, fromSeconds: playEvents.fromSeconds, atSeconds: playEvents.atSeconds })
      .from(playEvents)
      .where(and(eq(playEvents.versionId, row.version.id), inArray(playEvents.kind, ['seek', 'chapter']))),
  ]);
  const insights = classInsights(
    chapters,
    progress.map((p) => ({ userId: p.userId, positionSeconds: p.positionSeconds, finished: !!p.finishedAt, watchedSpans: p.watchedSpans as [number, number][] })),
    jumps.flatMap((j) => (j.fromSeconds == null ? [] : [{ userId: j.userId, fromSeconds: j.fromSeconds, atSeconds: j.atSeconds }])),
  );
  return { ...insights, versionNumber: row.version.number };
}
