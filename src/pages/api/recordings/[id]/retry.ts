import type { APIRoute } from 'astro';
import { endpoint, json } from '~/server/http/api';
import { requireCan } from '~/server/http/guards';
import { mediaDeps } from '~/server/media-deps';
import { retryRecording } from '~/server/services/recordings';

export const POST: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireCan(locals, 'recording.upload');
  return json(await retryRecording(mediaDeps(), studio.studioId, params.id!));
});
