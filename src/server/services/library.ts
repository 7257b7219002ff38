import { and, asc, count, desc, eq, isNotNull, isNull, sql, type SQL } from 'drizzle-orm';
import { lessons, playProgress, users } from '~/db/schema';
import { LENGTH_RANGES, PAGE_SIZE, type LibraryQuery } from '~/lib/api/library-schemas';
import type { AppDeps } from '../app';
import { notifyLibraryChanged } from '../library-cache';

const cardColumns = {
  id: lessons.id,
  slug: lessons.slug,
  title: lessons.title,
  description: lessons.description,
  advertisedMinutes: lessons.advertisedMinutes,
  publishedSeconds: lessons.publishedSeconds,
  equipment: lessons.equipment,
  impact: lessons.impact,
  focus: lessons.focus,
  difficulty: lessons.difficulty,
  coachId: lessons.coachId,
  coachName: users.name,
  recordingId: lessons.currentRecordingId,
  coverPath: lessons.coverPath,
};

const published = (studioId: string) =>
  and(eq(lessons.studioId, studioId), eq(lessons.state, 'published'), isNotNull(lessons.publishedVersionId));

/** Published classes of a studio for the member library, newest first. */
export async function publishedLessons(deps: AppDeps, studioId: string, limit = 48) {
  return deps.db
    .select(cardColumns)
    .from(lessons)
    .innerJoin(users, eq(users.id, lessons.coachId))
    .where(published(studioId))
    .orderBy(desc(lessons.updatedAt), asc(lessons.id))
    .limit(limit);
}

/** Tells every process that a studio's library changed, so shared pages are recomputed. */
export async function libraryChanged(deps: AppDeps, studioId: string) {
  deps.libraryCache?.forget(studioId);
  await notifyLibraryChanged(deps.pool, studioId);
}

/**
 * One page of the library (see querySearchLibrary). Every member asking for the same filters
 * gets the same page, so the web server shares it (src/server/library-cache.ts).
 */
export function searchLibrary(deps: AppDeps, studioId: string, q: LibraryQuery) {
  return shared(deps, studioId, `listing:${JSON.stringify(q)}`, () => querySearchLibrary(deps, studioId, q));
}

/** Through the web server's shared cache when these deps have one (tests' own deps do not). */
function shared<T>(deps: AppDeps, studioId: string, key: string, load: () => Promise<T>): Promise<T> {
  return deps.libraryCache ? deps.libraryCache.get(studioId, key, load) : load();
}

/**
 * One page of the library, filtered and sorted on the server. Filters combine with AND across
 * kinds and OR within a kind (low OR moderate impact). Sorting ends on the id so pages are stable.
 */
async function querySearchLibrary(deps: AppDeps, studioId: string, q: LibraryQuery) {
  const where: (SQL | undefined)[] = [published(studioId)];
  const minutes = lessons.listedMinutes;
  if (q.length.length) {
    where.push(sql`(${sql.join(q.length.map((r) => sql`(${minutes} >= ${LENGTH_RANGES[r][0]} and ${minutes} < ${LENGTH_RANGES[r][1]})`), sql` or `)})`);
  }
  if (q.impact.length) where.push(sql`${lessons.impact} in ${q.impact}`);
  if (q.difficulty.length) where.push(sql`${lessons.difficulty} in ${q.difficulty}`);
  if (q.coach.length) where.push(sql`${lessons.coachId} in ${q.coach}`);
  if (q.focus.length) where.push(sql`${lessons.focus} && ${sql`array[${sql.join(q.focus.map((f) => sql`${f}`), sql`, `)}]::text[]`}`);
  const named = q.equipment.filter((e) => e !== 'none');
  if (q.equipment.length) {
    const parts: SQL[] = [];
    if (q.equipment.includes('none')) parts.push(sql`cardinality(${lessons.equipment}) = 0`);
    if (named.length) parts.push(sql`${lessons.equipment} && ${sql`array[${sql.join(named.map((f) => sql`${f}`), sql`, `)}]::text[]`}`);
    where.push(sql`(${sql.join(parts, sql` or `)})`);
  }
  const tsquery = q.q ? sql`websearch_to_tsquery('english', ${q.q})` : null;
  if (tsquery) where.push(sql`to_tsvector('english', ${lessons.searchDocument}) @@ ${tsquery}`);
  const condition = and(...where);
  const order = {
    shortest: [asc(minutes), asc(lessons.id)],
    longest: [desc(minutes), asc(lessons.id)],
    title: [asc(lessons.title), asc(lessons.id)],
    newest: [desc(lessons.publishedAt), asc(lessons.id)],
  }[q.sort];
  const [rows, [total]] = await Promise.all([
    deps.db
      .select(cardColumns)
      .from(lessons)
      .innerJoin(users, eq(users.id, lessons.coachId))
      .where(condition)
      .orderBy(...order)
      .limit(PAGE_SIZE)
      .offset((q.page - 1) * PAGE_SIZE),
    deps.db.select({ n: count() }).from(lessons).where(condition),
  ]);
  return { lessons: rows, total: total?.n ?? 0, pages: Math.max(1, Math.ceil((total?.n ?? 0) / PAGE_SIZE)) };
}

/** Values to offer as filters: coaches, equipment and focus areas in use (shared like pages). */
export function libraryFacets(deps: AppDeps, studioId: string) {
  return shared(deps, studioId, 'facets', () => computeFacets(deps, studioId));
}

async function computeFacets(deps: AppDeps, studioId: string) {
  const [coaches, equipment, focus] = await Promise.all([
    deps.db
      .selectDistinct({ id: users.id, name: users.name })
      .from(lessons)
      .innerJoin(users, eq(users.id, lessons.coachId))
      .where(published(studioId))
      .orderBy(users.name),
    deps.db.execute<{ v: string }>(sql`select distinct unnest(${lessons.equipment}) as v from ${lessons} where ${published(studioId)} order by 1`),
    deps.db.execute<{ v: string }>(sql`select distinct unnest(${lessons.focus}) as v from ${lessons} where ${published(studioId)} order by 1`),
  ]);
  return { coaches, equipment: equipment.rows.map((r) => r.v), focus: focus.rows.map((r) => r.v) };
}

/** Classes the member started and has not finished, most recent first ("Continue"). */
export async function continueWatching(deps: AppDeps, studioId: string, userId: string, limit = 6) {
  return deps.db
    .select({ ...cardColumns, positionSeconds: playProgress.positionSeconds })
    .from(playProgress)
    .innerJoin(lessons, eq(lessons.id, playProgress.lessonId))
    .innerJoin(users, eq(users.id, lessons.coachId))
    .where(and(published(studioId), eq(playProgress.userId, userId), isNull(playProgress.finishedAt), sql`${playProgress.positionSeconds} > 10`))
    .orderBy(desc(playProgress.updatedAt))
    .limit(limit);
}

/** Classes the member finished, newest first (history page). */
export async function finishedClasses(deps: AppDeps, studioId: string, userId: string) {
  return deps.db
    .select({ ...cardColumns, finishedAt: playProgress.finishedAt, state: lessons.state })
    .from(playProgress)
    .innerJoin(lessons, eq(lessons.id, playProgress.lessonId))
    .innerJoin(users, eq(users.id, lessons.coachId))
    .where(and(eq(lessons.studioId, studioId), eq(playProgress.userId, userId), isNotNull(playProgress.finishedAt)))
    .orderBy(desc(playProgress.finishedAt));
}
