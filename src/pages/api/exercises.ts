import type { APIRoute } from 'astro';
import { createExerciseInput, exerciseListOutput, exerciseOutput, updateExerciseInput } from '~/lib/api/exercise-schemas';
import { app } from '~/server/app';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requireCan } from '~/server/http/guards';
import { createExercise, listExercises, updateExercise } from '~/server/services/exercises';

export const GET: APIRoute = endpoint(async ({ locals }) => {
  const { studio } = requireCan(locals, 'exercise.edit');
  return answer(exerciseListOutput, { exercises: await listExercises(app(), studio.studioId) });
});

export const POST: APIRoute = endpoint(async ({ locals, request }) => {
  const { studio } = requireCan(locals, 'exercise.edit');
  return answer(exerciseOutput, await createExercise(app(), studio.studioId, await readJson(request, createExerciseInput)), 201);
});

export const PATCH: APIRoute = endpoint(async ({ locals, request }) => {
  const { studio } = requireCan(locals, 'exercise.edit');
  return answer(exerciseOutput, await updateExercise(app(), studio.studioId, await readJson(request, updateExerciseInput)));
});
