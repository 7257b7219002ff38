import type { APIRoute } from 'astro';
import { app } from '~/server/app';
import { answer, endpoint } from '~/server/http/api';
import { checkResultOutput } from '~/lib/api/timeline-schemas';
import { requireCan } from '~/server/http/guards';
import { checkClass } from '~/server/services/class-check';

export const POST: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireCan(locals, 'class.check');
  return answer(checkResultOutput, await checkClass(app(), studio.studioId, params.id!));
});
