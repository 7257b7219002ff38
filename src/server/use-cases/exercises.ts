import type {
  CreateExerciseInput,
  ExerciseOutput,
  MergeExercisesInput,
  MergeExercisesOutput,
  UpdateExerciseInput,
} from '~/lib/api/exercise-schemas';
import type { AppDeps } from '../app';
import { createExercise, mergeExercises, updateExercise } from '../services/exercises';
import { assertCan, type Actor } from './actor';

/** Adds a name to the studio's exercise list (staff). */
export async function addExercise(actor: Actor, deps: AppDeps, input: CreateExerciseInput): Promise<ExerciseOutput> {
  assertCan(actor, 'exercise.edit');
  return createExercise(deps, actor.studioId, input);
}

/** Changes an exercise's name, cautions or easier/harder options (staff). */
export async function editExercise(actor: Actor, deps: AppDeps, input: UpdateExerciseInput): Promise<ExerciseOutput> {
  assertCan(actor, 'exercise.edit');
  return updateExercise(deps, actor.studioId, input);
}

/** Merges two names into one; classes and templates that named the merged one follow (staff). */
export async function mergeExerciseNames(actor: Actor, deps: AppDeps, input: MergeExercisesInput): Promise<MergeExercisesOutput> {
  assertCan(actor, 'exercise.edit');
  return mergeExercises(deps, actor.studioId, input);
}
