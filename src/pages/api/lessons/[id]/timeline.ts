import type { APIRoute } from 'astro';
import { timelinePutSchema } from '~/lib/timeline/timeline-schema';
import { app } from '~/server/app';
import { endpoint, json, readJson } from '~/server/http/api';
import { requireRole, STAFF } from '~/server/http/guards';
import { getLesson } from '~/server/services/lessons';
import { getTimeline, putTimeline } from '~/server/services/timelines';

export const GET: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireRole(locals, STAFF);
  return json(await getTimeline(app(), studio.studioId, params.id!));
});

export const PUT: APIRoute = endpoint(async ({ locals, params, request }) => {
  const { studio } = requireRole(locals, STAFF);
  await getLesson(app(), studio.studioId, params.id!);
  const { version, segments, cues } = await readJson(request, timelinePutSchema);
  return json(await putTimeline(app(), studio.studioId, params.id!, version, { segments, cues }));
});
