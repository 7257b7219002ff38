import type { APIRoute } from 'astro';
import { archivedOutput } from '~/lib/api/publish-schemas';
import { app } from '~/server/app';
import { answer, endpoint } from '~/server/http/api';
import { requireActor } from '~/server/http/guards';
import { archiveClass } from '~/server/use-cases/withdraw-class';

/** Archives the class: gone from the library, kept for history. */
export const POST: APIRoute = endpoint(async ({ locals, params }) => {
  await archiveClass(requireActor(locals), app(), { lessonId: params.id! });
  return answer(archivedOutput, { state: 'archived' });
});
