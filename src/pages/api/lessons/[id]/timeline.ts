import type { APIRoute } from 'astro';
import { timelinePutSchema } from '~/lib/timeline/timeline-schema';
import { app } from '~/server/app';
import { endpoint, json, readJson } from '~/server/http/api';
import { requireActor, requireCan } from '~/server/http/guards';
import { getTimeline } from '~/server/services/timelines';
import { saveClassTimeline } from '~/server/use-cases/class-marks';

export const GET: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireCan(locals, 'class.view');
  return json(await getTimeline(app(), studio.studioId, params.id!));
});

export const PUT: APIRoute = endpoint(async ({ locals, params, request }) => {
  const actor = requireActor(locals);
  const { version, segments, cues } = await readJson(request, timelinePutSchema);
  return json(await saveClassTimeline(actor, app(), { lessonId: params.id!, version, timeline: { segments, cues } }));
});
