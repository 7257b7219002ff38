import type { APIRoute } from 'astro';
import { app } from '~/server/app';
import { endpoint, json } from '~/server/http/api';
import { requireCan } from '~/server/http/guards';
import { checkClass } from '~/server/services/class-check';

export const POST: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireCan(locals, 'class.check');
  return json(await checkClass(app(), studio.studioId, params.id!));
});
