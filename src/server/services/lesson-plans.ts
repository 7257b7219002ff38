import { and, eq, sql } from 'drizzle-orm';
import { lessons } from '~/db/schema';
import { planSchema, type Plan } from '~/lib/plan/plan-schema';
import { expandPlan } from '~/lib/plan/expand-plan';
import type { PlanViewOutput } from '~/lib/api/timeline-schemas';
import { AppError, notFound } from '../errors';
import type { AppDeps } from '../app';
import { addMissingExercises } from './exercises';

/** The plan as the API shows it (`planViewOutput` in src/lib/api/timeline-schemas.ts). */
export type PlanView = PlanViewOutput;

/** Exercise names a plan mentions, in order of first use. */
export function planExerciseNames(plan: Plan): string[] {
  const names: string[] = [];
  for (const b of plan.blocks) {
    if (b.kind === 'circuit') names.push(...b.stations.map((s) => s.exercise));
    if (b.kind === 'intervals') names.push(b.exercise);
    if (b.kind === 'amrap' || b.kind === 'emom') names.push(...b.exercises);
  }
  return [...new Set(names)];
}

/** Reads a stored plan; plans are validated on write, and parsing again fills defaults added since. */
export function parseStoredPlan(value: unknown): Plan | null {
  if (value == null) return null;
  const parsed = planSchema.safeParse(value);
  return parsed.success ? parsed.data : null;
}

/** The class's plan with its expected schedule (from 0 s) and totals. */
export async function getPlan(deps: AppDeps, studioId: string, lessonId: string): Promise<PlanView> {
  const [row] = await deps.db
    .select({ plan: lessons.plan, version: lessons.version })
    .from(lessons)
    .where(and(eq(lessons.id, lessonId), eq(lessons.studioId, studioId)));
  if (!row) throw notFound('That class');
  const plan = parseStoredPlan(row.plan);
  return { plan, version: row.version, schedule: plan ? expandPlan(plan) : null };
}

const stalePlan = (currentVersion: number) =>
  new AppError(
    'conflict',
    'Someone saved this class after you opened it. Nothing of yours was saved: reload to see their plan, then make your change again.',
    undefined,
    { currentVersion },
  );

/**
 * Stores a validated plan when `version` is the class's current version, and adds new exercise
 * names to the studio's list, in one transaction. A stale version answers 409 and changes nothing.
 */
export async function putPlan(deps: AppDeps, studioId: string, lessonId: string, version: number, plan: Plan): Promise<PlanView> {
  const out = await deps.db.transaction(async (tx) => {
    const updated = await tx
      .update(lessons)
      .set({ plan, updatedAt: new Date(), version: sql`${lessons.version} + 1` })
      .where(and(eq(lessons.id, lessonId), eq(lessons.studioId, studioId), eq(lessons.version, version)))
      .returning({ version: lessons.version });
    if (updated.length === 0) {
      const [current] = await tx
        .select({ version: lessons.version })
        .from(lessons)
        .where(and(eq(lessons.id, lessonId), eq(lessons.studioId, studioId)));
      if (!current) throw notFound('That class');
      throw stalePlan(current.version);
    }
    return { version: updated[0]!.version, addedExercises: await addMissingExercises(tx, studioId, planExerciseNames(plan)) };
  });
  return { plan, schedule: expandPlan(plan), ...out };
}
