import type { APIRoute } from 'astro';
import { playerPreferencesPut } from '~/lib/captions/caption-schema';
import { app } from '~/server/app';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requireUser } from '~/server/http/guards';
import { rememberCaptionsChoice } from '~/server/use-cases/class-captions';

/** Remembers the member's player choices (captions on or off) with their account. */
export const PUT: APIRoute = endpoint(async ({ locals, request }) => {
  const { user } = requireUser(locals);
  const { captionsOn } = await readJson(request, playerPreferencesPut);
  return answer(playerPreferencesPut, await rememberCaptionsChoice(user.id, app(), captionsOn));
});
