import type { APIRoute } from 'astro';
import { planPutSchema } from '~/lib/plan/plan-schema';
import { app } from '~/server/app';
import { endpoint, json, readJson } from '~/server/http/api';
import { requireActor, requireCan } from '~/server/http/guards';
import { getPlan } from '~/server/services/lesson-plans';
import { saveClassPlan } from '~/server/use-cases/class-marks';

export const GET: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireCan(locals, 'class.view');
  return json(await getPlan(app(), studio.studioId, params.id!));
});

export const PUT: APIRoute = endpoint(async ({ locals, params, request }) => {
  const actor = requireActor(locals);
  const { version, ...plan } = await readJson(request, planPutSchema);
  return json(await saveClassPlan(actor, app(), { lessonId: params.id!, version, plan }));
});
