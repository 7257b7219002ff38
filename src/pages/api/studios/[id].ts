import type { APIRoute } from 'astro';
import { studioIdentityInput, studioIdentityOutput } from '~/lib/api/studio-schemas';
import { app } from '~/server/app';
import { answer, endpoint, readJson } from '~/server/http/api';
import { actorIn } from '~/server/http/guards';
import { changeStudioIdentity } from '~/server/use-cases/studio-settings';

/** Renames the studio, moves its address (the old one redirects) and recolours it: owners only; a studio you are not in answers 404. */
export const PUT: APIRoute = endpoint(async ({ locals, params, request }) => {
  const actor = actorIn(locals, params.id!);
  return answer(studioIdentityOutput, await changeStudioIdentity(actor, app(), await readJson(request, studioIdentityInput)));
});
