import type { APIRoute } from 'astro';
import { captionsToVtt } from '~/lib/captions/captions-vtt';
import { app } from '~/server/app';
import { endpoint } from '~/server/http/api';
import { requireUser } from '~/server/http/guards';
import { AppError } from '~/server/errors';
import { publishedClass } from '~/server/services/member-classes';
import { hasEntitlement } from '~/server/services/entitlement';

/** The published version's captions as a WebVTT file, for the player's <track kind="captions">. */
export const GET: APIRoute = endpoint(async ({ locals, params }) => {
  requireUser(locals);
  const missing = new AppError('not_found', 'That class has no captions.');
  if (!locals.studio) throw missing;
  const cls = await publishedClass(app(), locals.studio.studioId, params.slug!);
  // Captions belong to the class's media: the same membership check as the video and chapters.
  if (!(await hasEntitlement(app(), locals.studio.studioId, locals.user!.id))) throw missing;
  if (!cls.snapshot.captions) throw missing;
  return new Response(captionsToVtt(cls.snapshot.captions.cues), { headers: { 'content-type': 'text/vtt; charset=utf-8', 'cache-control': 'private, max-age=300' } });
});
