import type { APIRoute } from 'astro';
import { timelinePutSchema } from '~/lib/timeline/timeline-schema';
import { app } from '~/server/app';
import { answer, endpoint, readJson } from '~/server/http/api';
import { timelineOutput, timelineSavedOutput } from '~/lib/api/timeline-schemas';
import { requireActor, requireCan } from '~/server/http/guards';
import { getTimeline } from '~/server/services/timelines';
import { saveClassTimeline } from '~/server/use-cases/class-marks';

export const GET: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireCan(locals, 'class.view');
  return answer(timelineOutput, await getTimeline(app(), studio.studioId, params.id!));
});

export const PUT: APIRoute = endpoint(async ({ locals, params, request }) => {
  const actor = requireActor(locals);
  const { version, segments, cues } = await readJson(request, timelinePutSchema);
  return answer(timelineSavedOutput, await saveClassTimeline(actor, app(), { lessonId: params.id!, version, timeline: { segments, cues } }));
});
