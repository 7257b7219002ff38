import type { APIRoute } from 'astro';
import { coverFrameInput, coverFrameOutput } from '~/lib/api/cover-schemas';
import { app } from '~/server/app';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requireActor } from '~/server/http/guards';
import { coverFromFrame } from '~/server/use-cases/class-cover';

/** Queues the picture; 202 with the request to follow (the worker takes the frame). */
export const POST: APIRoute = endpoint(async ({ locals, params, request }) => {
  const actor = requireActor(locals);
  const frame = await readJson(request, coverFrameInput);
  return answer(coverFrameOutput, await coverFromFrame(actor, app(), { lessonId: params.id!, frame }), 202);
});
