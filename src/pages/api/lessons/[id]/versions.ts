import type { APIRoute } from 'astro';
import { app } from '~/server/app';
import { endpoint, json } from '~/server/http/api';
import { requireRole, STAFF } from '~/server/http/guards';
import { listVersions } from '~/server/services/publishing';

export const GET: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireRole(locals, STAFF);
  return json({ versions: await listVersions(app(), studio.studioId, params.id!) });
});
