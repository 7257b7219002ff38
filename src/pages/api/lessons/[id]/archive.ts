import type { APIRoute } from 'astro';
import { app } from '~/server/app';
import { endpoint, json } from '~/server/http/api';
import { PUBLISHERS, requireRole } from '~/server/http/guards';
import { setLessonState } from '~/server/services/publishing';

/** Archives the class: gone from the library, kept for history. */
export const POST: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireRole(locals, PUBLISHERS);
  await setLessonState(app(), studio.studioId, params.id!, 'archived');
  return json({ state: 'archived' });
});
