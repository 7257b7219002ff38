import { and, desc, eq, sql } from 'drizzle-orm';
import { lessons, memberships, users } from '~/db/schema';
import type { CreateLessonInput, LessonOutput, UpdateLessonInput } from '~/lib/api/lesson-schemas';
import { AppError, notFound } from '../errors';
import type { AppDeps } from '../app';
import { libraryChanged } from './library';

type LessonRow = typeof lessons.$inferSelect;

function toOutput(row: LessonRow, coachName: string): LessonOutput {
  return {
    id: row.id,
    slug: row.slug,
    title: row.title,
    description: row.description,
    advertisedMinutes: row.advertisedMinutes,
    mediaSeconds: row.mediaSeconds,
    equipment: row.equipment,
    impact: row.impact,
    focus: row.focus,
    difficulty: row.difficulty,
    cautions: row.cautions,
    coachId: row.coachId,
    coachName,
    state: row.state,
    version: row.version,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

/** URL-safe slug from a title ("Lunch-hour Ladder" -> "lunch-hour-ladder"). */
export function slugify(title: string): string {
  const base = title
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60);
  return base || 'class';
}

async function uniqueSlug(deps: AppDeps, studioId: string, title: string): Promise<string> {
  const base = slugify(title);
  const taken = await deps.db
    .select({ slug: lessons.slug })
    .from(lessons)
    .where(and(eq(lessons.studioId, studioId), sql`${lessons.slug} like ${base + '%'}`));
  const used = new Set(taken.map((t) => t.slug));
  if (!used.has(base)) return base;
  for (let n = 2; ; n++) if (!used.has(`${base}-${n}`)) return `${base}-${n}`;
}

/** The coach must be a coach or owner of the same studio. */
async function assertCoach(deps: AppDeps, studioId: string, coachId: string): Promise<void> {
  const rows = await deps.db
    .select({ role: memberships.role })
    .from(memberships)
    .where(and(eq(memberships.studioId, studioId), eq(memberships.userId, coachId)));
  if (!rows.some((r) => r.role === 'coach' || r.role === 'owner')) {
    throw new AppError('invalid_input', 'Choose a coach of this studio.', { coachId: 'Choose a coach of this studio.' });
  }
}

/** All classes of a studio, newest edits first, with the coach's name. */
export async function listLessons(deps: AppDeps, studioId: string): Promise<LessonOutput[]> {
  const rows = await deps.db
    .select({ lesson: lessons, coachName: users.name })
    .from(lessons)
    .innerJoin(users, eq(users.id, lessons.coachId))
    .where(eq(lessons.studioId, studioId))
    .orderBy(desc(lessons.updatedAt));
  return rows.map((r) => toOutput(r.lesson, r.coachName));
}

/** One class of the studio; another studio's class is "not found" so its existence does not leak. */
export async function getLesson(deps: AppDeps, studioId: string, id: string): Promise<LessonOutput> {
  if (!/^[0-9a-f-]{36}$/i.test(id)) throw notFound('That class');
  const [row] = await deps.db
    .select({ lesson: lessons, coachName: users.name })
    .from(lessons)
    .innerJoin(users, eq(users.id, lessons.coachId))
    .where(and(eq(lessons.id, id), eq(lessons.studioId, studioId)));
  if (!row) throw notFound('That class');
  return toOutput(row.lesson, row.coachName);
}

/** Creates a draft class; the creator teaches it unless another coach is named. */
export async function createLesson(
  deps: AppDeps,
  studioId: string,
  actorId: string,
  input: CreateLessonInput,
): Promise<LessonOutput> {
  const coachId = input.coachId ?? actorId;
  await assertCoach(deps, studioId, coachId);
  const slug = await uniqueSlug(deps, studioId, input.title);
  const [row] = await deps.db
    .insert(lessons)
    .values({ ...input, coachId, studioId, slug, mediaSeconds: input.mediaSeconds ?? null })
    .returning({ id: lessons.id });
  return getLesson(deps, studioId, row!.id);
}

/** Updates details when `version` is current; a stale version answers 409 and changes nothing. */
export async function updateLesson(
  deps: AppDeps,
  studioId: string,
  id: string,
  input: UpdateLessonInput,
): Promise<LessonOutput> {
  const current = await getLesson(deps, studioId, id);
  const { version, ...changes } = input;
  if (changes.coachId) await assertCoach(deps, studioId, changes.coachId);
  const updated = await deps.db
    .update(lessons)
    .set({ ...changes, version: sql`${lessons.version} + 1`, updatedAt: new Date() })
    .where(and(eq(lessons.id, id), eq(lessons.studioId, studioId), eq(lessons.version, version)))
    .returning({ id: lessons.id });
  if (updated.length === 0) {
    throw new AppError(
      'conflict',
      'Someone saved this class after you opened it. Reload to see their changes, then make yours again.',
      undefined,
      { currentVersion: current.version },
    );
  }
  // Cards show the class's details, so the library of a published class changes too.
  if (current.state === 'published') await libraryChanged(deps, studioId);
  return getLesson(deps, studioId, id);
}

/** Deletes a draft; published or archived classes are kept because members' history refers to them. */
export async function deleteLesson(deps: AppDeps, studioId: string, id: string): Promise<void> {
  const current = await getLesson(deps, studioId, id);
  if (current.state !== 'draft') {
    throw new AppError('conflict', 'Only draft classes can be deleted. Archive a published class instead.');
  }
  await deps.db.delete(lessons).where(and(eq(lessons.id, id), eq(lessons.studioId, studioId)));
}

/** Coaches and owners of a studio, for the coach picker. */
export async function listCoaches(deps: AppDeps, studioId: string) {
  const rows = await deps.db
    .selectDistinct({ id: users.id, name: users.name })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.studioId, studioId), sql`${memberships.role} in ('coach','owner')`))
    .orderBy(users.name);
  return rows;
}

/** The class's current recording id (null until one is ready), for a recording's status answer. */
export async function currentRecordingIdOf(deps: AppDeps, lessonId: string): Promise<string | null> {
  const [row] = await deps.db.select({ current: lessons.currentRecordingId }).from(lessons).where(eq(lessons.id, lessonId));
  return row?.current ?? null;
}
