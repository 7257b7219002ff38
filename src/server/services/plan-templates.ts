import { eq } from 'drizzle-orm';
import { planTemplates } from '~/db/schema';
import { BUILT_IN_TEMPLATES } from '~/lib/plan/plan-templates';
import type { CreatePlanTemplateInput, PlanTemplateOutput } from '~/lib/api/plan-template-schemas';
import { AppError } from '../errors';
import type { AppDeps } from '../app';
import { parseStoredPlan } from './lesson-plans';

/** The built-in formats first, then the studio's own templates by name. */
export async function listPlanTemplates(deps: AppDeps, studioId: string): Promise<PlanTemplateOutput[]> {
  const rows = await deps.db
    .select({ id: planTemplates.id, name: planTemplates.name, plan: planTemplates.plan })
    .from(planTemplates)
    .where(eq(planTemplates.studioId, studioId))
    .orderBy(planTemplates.name);
  const own = rows.flatMap((r) => {
    const plan = parseStoredPlan(r.plan);
    return plan ? [{ id: r.id, name: r.name, builtIn: false, plan }] : [];
  });
  return [...BUILT_IN_TEMPLATES.map((t) => ({ id: t.id, name: t.name, description: t.description, builtIn: true, plan: t.plan })), ...own];
}

/** Saves a validated plan as a studio template; names are unique per studio regardless of case. */
export async function createPlanTemplate(deps: AppDeps, studioId: string, userId: string, input: CreatePlanTemplateInput): Promise<PlanTemplateOutput> {
  const [row] = await deps.db
    .insert(planTemplates)
    .values({ studioId, name: input.name, plan: input.plan, createdBy: userId })
    .onConflictDoNothing()
    .returning({ id: planTemplates.id, name: planTemplates.name });
  if (!row) {
    throw new AppError('conflict', `The studio already has a template called "${input.name}". Choose another name.`, {
      name: 'A template with this name already exists.',
    });
  }
  return { id: row.id, name: row.name, builtIn: false, plan: input.plan };
}
