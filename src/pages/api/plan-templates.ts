import type { APIRoute } from 'astro';
import { createPlanTemplateInput, planTemplateListOutput, planTemplateOutput } from '~/lib/api/plan-template-schemas';
import { app } from '~/server/app';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requireActor, requireCan } from '~/server/http/guards';
import { listPlanTemplates } from '~/server/services/plan-templates';
import { savePlanTemplate } from '~/server/use-cases/plan-templates';

export const GET: APIRoute = endpoint(async ({ locals }) => {
  const { studio } = requireCan(locals, 'class.view');
  return answer(planTemplateListOutput, { templates: await listPlanTemplates(app(), studio.studioId) });
});

export const POST: APIRoute = endpoint(async ({ locals, request }) => {
  const actor = requireActor(locals);
  return answer(planTemplateOutput, await savePlanTemplate(actor, app(), await readJson(request, createPlanTemplateInput)), 201);
});
