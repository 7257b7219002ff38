import type { APIRoute } from 'astro';
import { exerciseUsageOutput } from '~/lib/api/exercise-schemas';
import { app } from '~/server/app';
import { answer, endpoint } from '~/server/http/api';
import { requireCan } from '~/server/http/guards';
import { exerciseUsage } from '~/server/services/exercises';

export const GET: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireCan(locals, 'exercise.edit');
  return answer(exerciseUsageOutput, await exerciseUsage(app(), studio.studioId, params.id!));
});
