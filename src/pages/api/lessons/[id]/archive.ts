import type { APIRoute } from 'astro';
import { app } from '~/server/app';
import { endpoint, json } from '~/server/http/api';
import { requireActor } from '~/server/http/guards';
import { archiveClass } from '~/server/use-cases/withdraw-class';

/** Archives the class: gone from the library, kept for history. */
export const POST: APIRoute = endpoint(async ({ locals, params }) => {
  await archiveClass(requireActor(locals), app(), { lessonId: params.id! });
  return json({ state: 'archived' });
});
