import type { APIRoute } from 'astro';
import { playerPreferencesPut } from '~/lib/captions/caption-schema';
import { app } from '~/server/app';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requireUser } from '~/server/http/guards';
import { captionsPreference } from '~/server/services/captions';
import { rememberCaptionsChoice } from '~/server/use-cases/class-captions';

/** The member's player choices as remembered (captions off until they turn them on). */
export const GET: APIRoute = endpoint(async ({ locals }) => {
  const { user } = requireUser(locals);
  return answer(playerPreferencesPut, { captionsOn: await captionsPreference(app(), user.id) });
});

/** Remembers the member's player choices (captions on or off) with their account. */
export const PUT: APIRoute = endpoint(async ({ locals, request }) => {
  const { user } = requireUser(locals);
  const { captionsOn } = await readJson(request, playerPreferencesPut);
  return answer(playerPreferencesPut, await rememberCaptionsChoice(user.id, app(), captionsOn));
});
