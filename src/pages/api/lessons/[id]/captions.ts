import type { APIRoute } from 'astro';
import { captionsOutput, captionsPutSchema, captionsSavedOutput } from '~/lib/captions/caption-schema';
import { app } from '~/server/app';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requireActor, requireCan } from '~/server/http/guards';
import { getCaptions } from '~/server/services/captions';
import { saveClassCaptions } from '~/server/use-cases/class-captions';

export const GET: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireCan(locals, 'class.view');
  return answer(captionsOutput, await getCaptions(app(), studio.studioId, params.id!));
});

export const PUT: APIRoute = endpoint(async ({ locals, params, request }) => {
  const actor = requireActor(locals);
  const body = await readJson(request, captionsPutSchema);
  return answer(captionsSavedOutput, await saveClassCaptions(actor, app(), { lessonId: params.id!, ...body }));
});
