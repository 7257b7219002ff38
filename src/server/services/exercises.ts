import { and, eq, inArray, sql } from 'drizzle-orm';
import { exercises } from '~/db/schema';
import type { CreateExerciseInput, ExerciseOutput, UpdateExerciseInput } from '~/lib/api/exercise-schemas';
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
