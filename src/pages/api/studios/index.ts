import type { APIRoute } from 'astro';
import { startStudioInput, studioListOutput, studioOutput } from '~/lib/api/studio-schemas';
import { app } from '~/server/app';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requireUser } from '~/server/http/guards';
import { chooseStudio } from '~/server/services/accounts';
import { listMyStudios } from '~/server/services/studio-list';
import { startStudio } from '~/server/use-cases/start-studio';

/** The studios the signed-in person belongs to, and the one this session works in. */
export const GET: APIRoute = endpoint(async ({ locals }) => {
  const { user } = requireUser(locals);
  return answer(studioListOutput, { studios: await listMyStudios(app(), user.id), currentStudioId: locals.studio?.studioId ?? null });
});

/** Start a studio as the signed-in person (visitors use the /start form, which makes the account too); this session then works in it. */
export const POST: APIRoute = endpoint(async ({ locals, request }) => {
  const { user, session } = requireUser(locals);
  const deps = app();
  const started = await startStudio(deps, { userId: user.id }, await readJson(request, startStudioInput));
  await chooseStudio(deps, { sessionId: session.id, userId: user.id }, started.studioId);
  const mine = (await listMyStudios(deps, user.id)).find((s) => s.id === started.studioId)!;
  return answer(studioOutput, mine, 201);
});
