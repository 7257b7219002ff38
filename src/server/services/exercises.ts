import { and, eq, inArray, isNotNull, sql } from 'drizzle-orm';
import { exercises, lessons, planTemplates, segments } from '~/db/schema';
import type {
  CreateExerciseInput,
  ExerciseOutput,
  ExerciseUsageOutput,
  MergeExercisesInput,
  MergeExercisesOutput,
  UpdateExerciseInput,
} from '~/lib/api/exercise-schemas';
import { renameExerciseInPlan } from '~/lib/plan/rename-exercise';
import { AppError, notFound } from '../errors';
import type { AppDeps } from '../app';

type Tx = Parameters<Parameters<AppDeps['db']['transaction']>[0]>[0];

const columns = {
  id: exercises.id,
  name: exercises.name,
  focus: exercises.focus,
  equipment: exercises.equipment,
  cautions: exercises.cautions,
  easierOption: exercises.easierOption,
  harderOption: exercises.harderOption,
};

const duplicate = (name: string) =>
  new AppError('conflict', `"${name}" is already in the exercise list.`, { name: 'This exercise is already in the list.' });

/** The studio's exercise list, by name. */
export function listExercises(deps: AppDeps, studioId: string): Promise<ExerciseOutput[]> {
  return deps.db.select(columns).from(exercises).where(eq(exercises.studioId, studioId)).orderBy(exercises.name);
}

/** Adds an exercise; names are unique per studio regardless of case. */
export async function createExercise(deps: AppDeps, studioId: string, input: CreateExerciseInput): Promise<ExerciseOutput> {
  const [row] = await deps.db.insert(exercises).values({ ...input, studioId }).onConflictDoNothing().returning(columns);
  if (!row) throw duplicate(input.name);
  return row;
}

/** Changes an exercise of the studio. */
export async function updateExercise(deps: AppDeps, studioId: string, input: UpdateExerciseInput): Promise<ExerciseOutput> {
  const { id, ...changes } = input;
  try {
    const [row] = await deps.db
      .update(exercises)
      .set({ ...changes, updatedAt: new Date() })
      .where(and(eq(exercises.id, id), eq(exercises.studioId, studioId)))
      .returning(columns);
    if (!row) throw notFound('That exercise');
    return row;
  } catch (err) {
    if ((err as { cause?: { code?: string } }).cause?.code === '23505' || (err as { code?: string }).code === '23505') {
      throw duplicate(changes.name ?? '');
    }
    throw err;
  }
}

/** Adds names a plan uses that the studio's list lacks (case-insensitive), inside the caller's transaction. */
export async function addMissingExercises(tx: Tx, studioId: string, names: readonly string[]): Promise<string[]> {
  if (names.length === 0) return [];
  const existing = await tx
    .select({ name: exercises.name })
    .from(exercises)
    .where(and(eq(exercises.studioId, studioId), inArray(sql`lower(${exercises.name})`, names.map((n) => n.toLowerCase()))));
  const known = new Set(existing.map((e) => e.name.toLowerCase()));
  const added = [...new Map(names.filter((n) => !known.has(n.toLowerCase())).map((n) => [n.toLowerCase(), n])).values()];
  if (added.length) await tx.insert(exercises).values(added.map((name) => ({ studioId, name }))).onConflictDoNothing();
  return added;
}

/** One exercise of the studio, or 404. */
async function exerciseOf(tx: Tx | AppDeps['db'], studioId: string, id: string, lock = false): Promise<ExerciseOutput> {
  const query = tx.select(columns).from(exercises).where(and(eq(exercises.id, id), eq(exercises.studioId, studioId)));
  const [row] = lock ? await query.for('update') : await query;
  if (!row) throw notFound('That exercise');
  return row;
}

/** Classes (plan or marks) and studio templates of the studio that name an exercise, ignoring case. */
export async function exerciseUsage(deps: AppDeps, studioId: string, id: string): Promise<ExerciseUsageOutput> {
  const { name } = await exerciseOf(deps.db, studioId, id);
  const lessonRows = await deps.db
    .select({ id: lessons.id, title: lessons.title, plan: lessons.plan })
    .from(lessons)
    .where(eq(lessons.studioId, studioId))
    .orderBy(lessons.title);
  const marked = new Set(
    (
      await deps.db
        .selectDistinct({ id: segments.lessonId })
        .from(segments)
        .innerJoin(lessons, eq(lessons.id, segments.lessonId))
        .where(and(eq(lessons.studioId, studioId), sql`lower(${segments.exercise}) = lower(${name})`))
    ).map((r) => r.id),
  );
  const templateRows = await deps.db
    .select({ id: planTemplates.id, name: planTemplates.name, plan: planTemplates.plan })
    .from(planTemplates)
    .where(eq(planTemplates.studioId, studioId))
    .orderBy(planTemplates.name);
  const names = (plan: unknown) => renameExerciseInPlan(plan, name, name).changed;
  return {
    classes: lessonRows.filter((l) => marked.has(l.id) || names(l.plan)).map(({ id, title }) => ({ id, title })),
    templates: templateRows.filter((t) => names(t.plan)).map(({ id, name }) => ({ id, name })),
  };
}

/**
 * Merges one exercise name into another in one transaction: every class plan, every class's marks
 * and every studio template that named `fromId` names `intoId` instead, blank details of the kept
 * exercise take the merged one's, and the merged name leaves the list. Classes whose plan or marks
 * changed get a new version (and timeline version), so an editor open on the old name answers 409
 * instead of writing it back. Published versions are immutable snapshots and keep their words.
 */
export async function mergeExercises(deps: AppDeps, studioId: string, input: MergeExercisesInput): Promise<MergeExercisesOutput> {
  return deps.db.transaction(async (tx) => {
    const from = await exerciseOf(tx, studioId, input.fromId, true);
    const into = await exerciseOf(tx, studioId, input.intoId, true);
    const planRows = await tx
      .select({ id: lessons.id, plan: lessons.plan })
      .from(lessons)
      .where(and(eq(lessons.studioId, studioId), isNotNull(lessons.plan)))
      .for('update');
    const changedLessons = new Set<string>();
    for (const row of planRows) {
      const renamed = renameExerciseInPlan(row.plan, from.name, into.name);
      if (!renamed.changed) continue;
      await tx.update(lessons).set({ plan: renamed.plan, version: sql`${lessons.version} + 1`, updatedAt: new Date() }).where(eq(lessons.id, row.id));
      changedLessons.add(row.id);
    }
    const studioLessons = tx.select({ id: lessons.id }).from(lessons).where(eq(lessons.studioId, studioId));
    const marked = await tx
      .update(segments)
      .set({ exercise: into.name })
      .where(and(inArray(segments.lessonId, studioLessons), sql`lower(${segments.exercise}) = lower(${from.name})`))
      .returning({ lessonId: segments.lessonId });
    const markedLessons = [...new Set(marked.map((m) => m.lessonId))];
    if (markedLessons.length) {
      await tx
        .update(lessons)
        .set({ timelineVersion: sql`${lessons.timelineVersion} + 1`, updatedAt: new Date() })
        .where(inArray(lessons.id, markedLessons));
    }
    markedLessons.forEach((id) => changedLessons.add(id));
    let templatesChanged = 0;
    const templateRows = await tx
      .select({ id: planTemplates.id, plan: planTemplates.plan })
      .from(planTemplates)
      .where(eq(planTemplates.studioId, studioId))
      .for('update');
    for (const row of templateRows) {
      const renamed = renameExerciseInPlan(row.plan, from.name, into.name);
      if (!renamed.changed) continue;
      await tx.update(planTemplates).set({ plan: renamed.plan }).where(eq(planTemplates.id, row.id));
      templatesChanged++;
    }
    const [kept] = await tx
      .update(exercises)
      .set({
        focus: into.focus ?? from.focus,
        equipment: into.equipment.length ? into.equipment : from.equipment,
        cautions: into.cautions || from.cautions,
        easierOption: into.easierOption || from.easierOption,
        harderOption: into.harderOption || from.harderOption,
        updatedAt: new Date(),
      })
      .where(eq(exercises.id, into.id))
      .returning(columns);
    await tx.delete(exercises).where(eq(exercises.id, from.id));
    return { kept: kept!, mergedName: from.name, classesChanged: changedLessons.size, templatesChanged };
  });
}
