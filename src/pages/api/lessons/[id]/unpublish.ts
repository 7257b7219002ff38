import type { APIRoute } from 'astro';
import { app } from '~/server/app';
import { endpoint, json } from '~/server/http/api';
import { PUBLISHERS, requireRole } from '~/server/http/guards';
import { setLessonState } from '~/server/services/publishing';

/** Takes the class out of the library; its versions stay for members' history. */
export const POST: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireRole(locals, PUBLISHERS);
  await setLessonState(app(), studio.studioId, params.id!, 'draft');
  return json({ state: 'draft' });
});
