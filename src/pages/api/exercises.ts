import type { APIRoute } from 'astro';
import { createExerciseInput, exerciseListOutput, exerciseOutput, updateExerciseInput } from '~/lib/api/exercise-schemas';
import { app } from '~/server/app';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requireActor, requireCan } from '~/server/http/guards';
import { listExercises } from '~/server/services/exercises';
import { addExercise, editExercise } from '~/server/use-cases/exercises';

export const GET: APIRoute = endpoint(async ({ locals }) => {
  const { studio } = requireCan(locals, 'exercise.edit');
  return answer(exerciseListOutput, { exercises: await listExercises(app(), studio.studioId) });
});

export const POST: APIRoute = endpoint(async ({ locals, request }) => {
  const actor = requireActor(locals);
  return answer(exerciseOutput, await addExercise(actor, app(), await readJson(request, createExerciseInput)), 201);
});

export const PATCH: APIRoute = endpoint(async ({ locals, request }) => {
  const actor = requireActor(locals);
  return answer(exerciseOutput, await editExercise(actor, app(), await readJson(request, updateExerciseInput)));
});
