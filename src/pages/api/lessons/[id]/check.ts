import type { APIRoute } from 'astro';
import { app } from '~/server/app';
import { endpoint, json } from '~/server/http/api';
import { requireRole, STAFF } from '~/server/http/guards';
import { checkLesson } from '~/server/services/timelines';

export const POST: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireRole(locals, STAFF);
  return json(await checkLesson(app(), studio.studioId, params.id!));
});
