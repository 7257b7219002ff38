import type { APIRoute } from 'astro';
import { coverChoiceInput, coverOutput } from '~/lib/api/cover-schemas';
import { app } from '~/server/app';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requireActor, requireCan } from '~/server/http/guards';
import { getCover } from '~/server/services/lesson-cover';
import { chooseClassCover } from '~/server/use-cases/class-cover';

export const GET: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireCan(locals, 'class.view');
  return answer(coverOutput, await getCover(app(), studio.studioId, params.id!));
});

export const PUT: APIRoute = endpoint(async ({ locals, params, request }) => {
  const actor = requireActor(locals);
  const choice = await readJson(request, coverChoiceInput);
  return answer(coverOutput, await chooseClassCover(actor, app(), { lessonId: params.id!, choice }));
});
