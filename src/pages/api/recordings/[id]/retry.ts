import type { APIRoute } from 'astro';
import { endpoint, json } from '~/server/http/api';
import { requireRole, STAFF } from '~/server/http/guards';
import { mediaDeps } from '~/server/media-deps';
import { retryRecording } from '~/server/services/recordings';

export const POST: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireRole(locals, STAFF);
  return json(await retryRecording(mediaDeps(), studio.studioId, params.id!));
});
