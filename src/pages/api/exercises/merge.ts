import type { APIRoute } from 'astro';
import { mergeExercisesInput, mergeExercisesOutput } from '~/lib/api/exercise-schemas';
import { app } from '~/server/app';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requireActor } from '~/server/http/guards';
import { mergeExerciseNames } from '~/server/use-cases/exercises';

export const POST: APIRoute = endpoint(async ({ locals, request }) => {
  const actor = requireActor(locals);
  return answer(mergeExercisesOutput, await mergeExerciseNames(actor, app(), await readJson(request, mergeExercisesInput)));
});
