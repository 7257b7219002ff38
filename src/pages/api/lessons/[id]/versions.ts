import type { APIRoute } from 'astro';
import { app } from '~/server/app';
import { endpoint, json } from '~/server/http/api';
import { requireCan } from '~/server/http/guards';
import { listVersions } from '~/server/services/publishing';

export const GET: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireCan(locals, 'class.view');
  return json({ versions: await listVersions(app(), studio.studioId, params.id!) });
});
