import type { APIRoute } from 'astro';
import { currentStudioInput, studioOutput } from '~/lib/api/studio-schemas';
import { app } from '~/server/app';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requireUser } from '~/server/http/guards';
import { chooseStudio } from '~/server/services/accounts';
import { listMyStudios } from '~/server/services/studio-list';

/** Chooses the studio this session works in; a studio the person does not belong to answers 404. */
export const PUT: APIRoute = endpoint(async ({ locals, request }) => {
  const { user, session } = requireUser(locals);
  const deps = app();
  const { studioId } = await readJson(request, currentStudioInput);
  await chooseStudio(deps, { sessionId: session.id, userId: user.id }, studioId);
  const mine = (await listMyStudios(deps, user.id)).find((s) => s.id === studioId)!;
  return answer(studioOutput, mine);
});
