import type { APIRoute } from 'astro';
import { app } from '~/server/app';
import { endpoint } from '~/server/http/api';
import { requireUser } from '~/server/http/guards';
import { mediaKeyFor, streamObject } from '~/server/services/media-access';
import { storage } from '~/server/storage';

/**
 * Recording media (HLS playlists and segments, poster, peaks) through an authenticated proxy:
 * URLs name only the recording, never storage keys, and each request checks who may watch.
 */
export const GET: APIRoute = endpoint(async ({ locals, params, request }) => {
  const { user } = requireUser(locals);
  const { key, contentType } = await mediaKeyFor(app(), locals.studio, params.id!, params.path ?? '', user.id);
  const { s3, bucket } = storage();
  return streamObject(s3, bucket, key, contentType, request.headers.get('range'));
});
