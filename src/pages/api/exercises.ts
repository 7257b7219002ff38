import type { APIRoute } from 'astro';
import { createExerciseInput, updateExerciseInput } from '~/lib/api/exercise-schemas';
import { app } from '~/server/app';
import { endpoint, json, readJson } from '~/server/http/api';
import { requireCan } from '~/server/http/guards';
import { createExercise, listExercises, updateExercise } from '~/server/services/exercises';

export const GET: APIRoute = endpoint(async ({ locals }) => {
  const { studio } = requireCan(locals, 'exercise.edit');
  return json({ exercises: await listExercises(app(), studio.studioId) });
});

export const POST: APIRoute = endpoint(async ({ locals, request }) => {
  const { studio } = requireCan(locals, 'exercise.edit');
  return json(await createExercise(app(), studio.studioId, await readJson(request, createExerciseInput)), 201);
});

export const PATCH: APIRoute = endpoint(async ({ locals, request }) => {
  const { studio } = requireCan(locals, 'exercise.edit');
  return json(await updateExercise(app(), studio.studioId, await readJson(request, updateExerciseInput)));
});
