import { z } from 'zod';
import { noControlCharacters } from './text-rules';
import { exerciseNameSchema } from '../plan/plan-schema';

const optionalText = (field: string, max: number) =>
  z.string().trim().max(max).regex(...noControlCharacters(field, { multiline: true })).nullable().optional();

const exerciseFields = {
  name: exerciseNameSchema,
  focus: optionalText('The focus', 60),
  equipment: z.array(z.string().trim().min(1).max(60).regex(...noControlCharacters('Each item of equipment'))).max(20),
  cautions: optionalText('The cautions text', 1000).describe('Shown to members when this exercise is on.'),
  easierOption: optionalText('The easier option', 300),
  harderOption: optionalText('The harder option', 300),
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

export const exerciseListOutput = z.object({ exercises: z.array(exerciseOutput) }).meta({ id: 'Exercises' });
export type ExerciseListOutput = z.infer<typeof exerciseListOutput>;

/** Merging two names into one: `fromId` goes away, classes and templates that named it name `intoId`. */
export const mergeExercisesInput = z
  .object({
    fromId: z.guid({ error: 'Choose the name to merge away.' }),
    intoId: z.guid({ error: 'Choose the name to keep.' }),
  })
  .refine((v) => v.fromId !== v.intoId, { path: ['intoId'], error: 'Choose two different names: one to keep and one to merge into it.' })
  .meta({ id: 'MergeExercisesInput' });
export type MergeExercisesInput = z.infer<typeof mergeExercisesInput>;

/** Where an exercise is named: shown before a merge so the person sees what will follow. */
export const exerciseUsageOutput = z
  .object({
    classes: z.array(z.object({ id: z.guid(), title: z.string() })).describe('Classes whose plan or marks name it'),
    templates: z.array(z.object({ id: z.guid(), name: z.string() })).describe('Studio templates whose plan names it'),
  })
  .meta({ id: 'ExerciseUsage' });
export type ExerciseUsageOutput = z.infer<typeof exerciseUsageOutput>;

export const mergeExercisesOutput = z
  .object({
    kept: exerciseOutput,
    mergedName: z.string(),
    classesChanged: z.number().int(),
    templatesChanged: z.number().int(),
  })
  .meta({ id: 'MergeExercisesResult' });
export type MergeExercisesOutput = z.infer<typeof mergeExercisesOutput>;
