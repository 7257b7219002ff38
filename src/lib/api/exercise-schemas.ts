import { z } from 'zod';
import { exerciseNameSchema } from '../plan/plan-schema';

const optionalText = (max: number) => z.string().trim().max(max).nullable().optional();

const exerciseFields = {
  name: exerciseNameSchema,
  focus: optionalText(60),
  equipment: z.array(z.string().trim().min(1).max(60)).max(20),
  cautions: optionalText(1000).describe('Shown to members when this exercise is on.'),
  easierOption: optionalText(300),
  harderOption: optionalText(300),
};

export const createExerciseInput = z
  .object({ ...exerciseFields, equipment: exerciseFields.equipment.default([]) })
  .meta({ id: 'CreateExerciseInput' });
export type CreateExerciseInput = z.infer<typeof createExerciseInput>;

export const updateExerciseInput = z
  .object({
    id: z.string().uuid(),
    name: exerciseFields.name.optional(),
    focus: exerciseFields.focus,
    equipment: exerciseFields.equipment.optional(),
    cautions: exerciseFields.cautions,
    easierOption: exerciseFields.easierOption,
    harderOption: exerciseFields.harderOption,
  })
  .meta({ id: 'UpdateExerciseInput' });
export type UpdateExerciseInput = z.infer<typeof updateExerciseInput>;

export const exerciseOutput = z
  .object({
    id: z.string().uuid(),
    name: z.string(),
    focus: z.string().nullable(),
    equipment: z.array(z.string()),
    cautions: z.string().nullable(),
    easierOption: z.string().nullable(),
    harderOption: z.string().nullable(),
  })
  .meta({ id: 'Exercise' });
export type ExerciseOutput = z.infer<typeof exerciseOutput>;
