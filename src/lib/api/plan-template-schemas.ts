import { z } from 'zod';
import { planSchema } from '../plan/plan-schema';
import { templateNameSchema } from '../plan/plan-templates';

/** Saving a plan as one of the studio's templates. */
export const createPlanTemplateInput = z
  .object({ name: templateNameSchema, plan: planSchema })
  .meta({ id: 'CreatePlanTemplateInput' });
export type CreatePlanTemplateInput = z.infer<typeof createPlanTemplateInput>;

export const planTemplateOutput = z
  .object({
    id: z.string().describe('A studio template\'s id, or a built-in template\'s name-like id.'),
    name: z.string(),
    description: z.string().optional(),
    builtIn: z.boolean(),
    plan: z.unknown().describe('A plan (see PUT /api/lessons/{id}/plan); built-in ones leave exercise names empty to be filled in.'),
  })
  .meta({ id: 'PlanTemplate' });
export type PlanTemplateOutput = z.infer<typeof planTemplateOutput>;

export const planTemplateListOutput = z.object({ templates: z.array(planTemplateOutput) }).meta({ id: 'PlanTemplateList' });
