import type { APIRoute } from 'astro';
import { planPutSchema } from '~/lib/plan/plan-schema';
import { app } from '~/server/app';
import { endpoint, answer, readJson } from '~/server/http/api';
import { planViewOutput } from '~/lib/api/timeline-schemas';
import { requireActor, requireCan } from '~/server/http/guards';
import { getPlan } from '~/server/services/lesson-plans';
import { saveClassPlan } from '~/server/use-cases/class-marks';

export const GET: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireCan(locals, 'class.view');
  return answer(planViewOutput, await getPlan(app(), studio.studioId, params.id!));
});

export const PUT: APIRoute = endpoint(async ({ locals, params, request }) => {
  const actor = requireActor(locals);
  const { version, ...plan } = await readJson(request, planPutSchema);
  return answer(planViewOutput, await saveClassPlan(actor, app(), { lessonId: params.id!, version, plan }));
});
