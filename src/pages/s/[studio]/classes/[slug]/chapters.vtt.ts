import type { APIRoute } from 'astro';
import { app } from '~/server/app';
import { endpoint } from '~/server/http/api';
import { requireUser } from '~/server/http/guards';
import { AppError } from '~/server/errors';
import { chaptersVttOf, publishedClass } from '~/server/services/member-classes';
import { hasEntitlement } from '~/server/services/entitlement';

/** The published version's WebVTT chapters file, for the player's <track kind="chapters">. */
export const GET: APIRoute = endpoint(async ({ locals, params }) => {
  requireUser(locals);
  if (!locals.studio) throw new AppError('not_found', 'That class could not be found.');
  const cls = await publishedClass(app(), locals.studio.studioId, params.slug!);
  // Chapters belong to the class's media: the same membership check as the video itself.
  if (!(await hasEntitlement(app(), locals.studio.studioId, locals.user!.id))) throw new AppError('not_found', 'That class could not be found.');
  return new Response(await chaptersVttOf(app(), cls.versionId), { headers: { 'content-type': 'text/vtt; charset=utf-8', 'cache-control': 'private, max-age=300' } });
});
