import type { APIRoute } from 'astro';
import { planSchema } from '~/lib/plan/plan-schema';
import { app } from '~/server/app';
import { endpoint, json, readJson } from '~/server/http/api';
import { requireRole, STAFF } from '~/server/http/guards';
import { getLesson } from '~/server/services/lessons';
import { getPlan, putPlan } from '~/server/services/lesson-plans';

export const GET: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireRole(locals, STAFF);
  return json(await getPlan(app(), studio.studioId, params.id!));
});

export const PUT: APIRoute = endpoint(async ({ locals, params, request }) => {
  const { studio } = requireRole(locals, STAFF);
  await getLesson(app(), studio.studioId, params.id!); // 404 before validating another studio's class
  const plan = await readJson(request, planSchema);
  return json(await putPlan(app(), studio.studioId, params.id!, plan));
});
