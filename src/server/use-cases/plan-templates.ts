import type { CreatePlanTemplateInput, PlanTemplateOutput } from '~/lib/api/plan-template-schemas';
import type { AppDeps } from '../app';
import { createPlanTemplate } from '../services/plan-templates';
import { assertCan, type Actor } from './actor';

/** Saves a plan as one of the studio's templates (anyone who may edit classes). */
export async function savePlanTemplate(actor: Actor, deps: AppDeps, input: CreatePlanTemplateInput): Promise<PlanTemplateOutput> {
  assertCan(actor, 'class.edit');
  return createPlanTemplate(deps, actor.studioId, actor.userId, input);
}
