import type { APIRoute } from 'astro';
import { sendBackInput, sentBackOutput } from '~/lib/api/review-schemas';
import { app } from '~/server/app';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requireActor } from '~/server/http/guards';
import { sendBackForChanges } from '~/server/use-cases/review-hand-off';

/** Sends a class that waits for review back to whoever prepared it, with a note (coach, owner). */
export const POST: APIRoute = endpoint(async ({ locals, params, request }) => {
  const actor = requireActor(locals);
  const input = await readJson(request, sendBackInput);
  return answer(sentBackOutput, await sendBackForChanges(actor, app(), { lessonId: params.id!, ...input }));
});
