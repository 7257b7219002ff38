/**
 * Answers of the plan, timeline and timing-check endpoints. The OpenAPI document, the endpoints
 * (through `answer`) and the editor share these; the shapes themselves live with their domain.
 */
import { z } from 'zod';
import { planSchema } from '../plan/plan-schema';
import { expectedScheduleSchema } from '../plan/expand-plan';
import { cueSchema, segmentSchema } from '../timeline/timeline-schema';
import { checkResultSchema } from '../timing/finding-types';

export const planViewOutput = z
  .object({
    plan: planSchema.nullable(),
    version: z.number().int().describe('The class version a plan edit must send back (shared with the class details)'),
    schedule: expectedScheduleSchema.nullable(),
    addedExercises: z.array(z.string()).optional().describe('Exercise names this save added to the studio’s list'),
  })
  .meta({ id: 'PlanView' });
export type PlanViewOutput = z.infer<typeof planViewOutput>;

export const timelineOutput = z
  .object({ version: z.number().int(), segments: z.array(segmentSchema), cues: z.array(cueSchema) })
  .meta({ id: 'Timeline' });
export type TimelineOutput = z.infer<typeof timelineOutput>;

export const timelineSavedOutput = z.object({ version: z.number().int() }).meta({ id: 'TimelineSaved' });
export type TimelineSavedOutput = z.infer<typeof timelineSavedOutput>;

export const checkResultOutput = checkResultSchema
  .extend({ version: z.number().int().describe('The saved timeline version the check ran on') })
  .meta({ id: 'CheckResult' });
export type CheckResultOutput = z.infer<typeof checkResultOutput>;

export const timelineImportOutput = z.object({ version: z.number().int(), segments: z.number().int(), cues: z.number().int() });
