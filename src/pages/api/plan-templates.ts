import type { APIRoute } from 'astro';
import { createPlanTemplateInput } from '~/lib/api/plan-template-schemas';
import { app } from '~/server/app';
import { endpoint, json, readJson } from '~/server/http/api';
import { requireRole, STAFF } from '~/server/http/guards';
import { createPlanTemplate, listPlanTemplates } from '~/server/services/plan-templates';

export const GET: APIRoute = endpoint(async ({ locals }) => {
  const { studio } = requireRole(locals, STAFF);
  return json({ templates: await listPlanTemplates(app(), studio.studioId) });
});

export const POST: APIRoute = endpoint(async ({ locals, request }) => {
  const { studio, user } = requireRole(locals, STAFF);
  return json(await createPlanTemplate(app(), studio.studioId, user.id, await readJson(request, createPlanTemplateInput)), 201);
});
