import type { APIRoute } from 'astro';
import { app } from '~/server/app';
import { endpoint } from '~/server/http/api';
import { requireUser } from '~/server/http/guards';
import { mediaAnswer } from '~/server/services/media-access';
import { storage } from '~/server/storage';

/**
 * Recording media (HLS playlists, segments, poster, peaks, chapter pictures). URLs name only the
 * recording; each request checks who may watch. Playlists come from here with every segment as a
 * short-lived signed storage link; any other file answers with a redirect to one, so video bytes
 * never pass through the app (a request for a byte range of a single file is served here).
 */
export const GET: APIRoute = endpoint(async ({ locals, params, request }) => {
  const { user } = requireUser(locals);
  const answer = await mediaAnswer(app(), storage(), locals.studio, params.id!, params.path ?? '', user.id, request.headers.get('range'));
  if (answer.kind === 'range') return answer.response;
  if (answer.kind === 'redirect') {
    // The link is personal and expires: never cached by shared caches, reused by this browser briefly.
    return new Response(null, { status: 302, headers: { location: answer.url, 'cache-control': 'private, max-age=300' } });
  }
  return new Response(answer.body, {
    headers: { 'content-type': 'application/vnd.apple.mpegurl', 'cache-control': 'private, no-store' },
  });
});
