import type { ExerciseOutput, ExerciseUsageOutput, MergeExercisesOutput, UpdateExerciseInput } from '~/lib/api/exercise-schemas';
import { apiCall } from '../api-client';

/** The Exercises page's calls to the JSON API (schemas in src/lib/api/exercise-schemas.ts). */
export const exerciseApi = {
  list: () => apiCall<{ exercises: ExerciseOutput[] }>('GET', '/api/exercises').then((r) => r.exercises),
  add: (name: string) => apiCall<ExerciseOutput>('POST', '/api/exercises', { name }),
  edit: (input: UpdateExerciseInput) => apiCall<ExerciseOutput>('PATCH', '/api/exercises', input),
  usage: (id: string) => apiCall<ExerciseUsageOutput>('GET', `/api/exercises/${id}/usage`),
  merge: (fromId: string, intoId: string) => apiCall<MergeExercisesOutput>('POST', '/api/exercises/merge', { fromId, intoId }),
};
