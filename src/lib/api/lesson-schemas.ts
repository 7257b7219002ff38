import { z } from 'zod';
import { INT4_MAX, noControlCharacters } from './text-rules';

export const impactLevels = ['low', 'moderate', 'high'] as const;
export const difficultyLevels = ['beginner', 'intermediate', 'advanced'] as const;
export const lessonStates = ['draft', 'published', 'archived'] as const;

const shortList = (what: string) =>
  z
    .array(z.string().trim().min(1).max(60).regex(...noControlCharacters(`Each of the ${what}`)), { error: `List ${what} as text items.` })
    .max(20, { error: `List at most 20 ${what}.` });

/** Editable class details, as the API and the create form accept them. */
export const lessonFields = {
  title: z.string({ error: 'Give the class a title.' }).trim().min(1, { error: 'Give the class a title.' }).max(140, { error: 'Keep the title under 140 characters.' }).regex(...noControlCharacters('The title')),
  description: z.string().trim().max(4000, { error: 'Keep the description under 4,000 characters.' }).regex(...noControlCharacters('The description', { multiline: true })),
  advertisedMinutes: z.coerce
    .number({ error: 'Enter the advertised length in minutes.' })
    .int({ error: 'Advertise the length in whole minutes.' })
    .min(1, { error: 'A class lasts at least 1 minute.' })
    .max(240, { error: 'Classes longer than 4 hours are not supported.' })
    .describe('Length shown on the class card, in whole minutes.'),
  // The column is a 4-byte float: a tiny positive value (1e-300) underflows it, which used to answer 500.
  mediaSeconds: z.number().min(0.001, { error: 'A recording lasts at least a millisecond (0.001 seconds).' }).max(24 * 3600).nullable().describe('Length of the recording in seconds, until a recording is uploaded.'),
  equipment: shortList('items of equipment'),
  impact: z.enum(impactLevels, { error: 'Choose low, moderate or high impact.' }),
  focus: shortList('focus areas'),
  difficulty: z.enum(difficultyLevels, { error: 'Choose beginner, intermediate or advanced.' }),
  cautions: z.string().trim().max(2000).regex(...noControlCharacters('The cautions text', { multiline: true })),
  coachId: z.string().min(1).max(64).regex(...noControlCharacters('The coach')).describe('The coach who teaches the class; defaults to the creator.'),
};

export const createLessonInput = z
  .object({
    title: lessonFields.title,
    advertisedMinutes: lessonFields.advertisedMinutes,
    description: lessonFields.description.default(''),
    mediaSeconds: lessonFields.mediaSeconds.optional(),
    equipment: lessonFields.equipment.default([]),
    impact: lessonFields.impact.default('low'),
    focus: lessonFields.focus.default([]),
    difficulty: lessonFields.difficulty.default('beginner'),
    cautions: lessonFields.cautions.default(''),
    coachId: lessonFields.coachId.optional(),
  })
  .meta({ id: 'CreateLessonInput' });
export type CreateLessonInput = z.infer<typeof createLessonInput>;

export const updateLessonInput = z
  .object({
    version: z.number().int().min(1).max(INT4_MAX, { error: 'That version does not exist; reload the class.' }).describe('The version you last read; a stale one answers 409.'),
    title: lessonFields.title.optional(),
    advertisedMinutes: lessonFields.advertisedMinutes.optional(),
    description: lessonFields.description.optional(),
    mediaSeconds: lessonFields.mediaSeconds.optional(),
    equipment: lessonFields.equipment.optional(),
    impact: lessonFields.impact.optional(),
    focus: lessonFields.focus.optional(),
    difficulty: lessonFields.difficulty.optional(),
    cautions: lessonFields.cautions.optional(),
    coachId: lessonFields.coachId.optional(),
  })
  .meta({ id: 'UpdateLessonInput' });
export type UpdateLessonInput = z.infer<typeof updateLessonInput>;

/** A class as the API answers it. */
export const lessonOutput = z
  .object({
    id: z.string().uuid(),
    slug: z.string(),
    title: z.string(),
    description: z.string(),
    advertisedMinutes: z.number().int(),
    mediaSeconds: z.number().nullable(),
    equipment: z.array(z.string()),
    impact: z.enum(impactLevels),
    focus: z.array(z.string()),
    difficulty: z.enum(difficultyLevels),
    cautions: z.string(),
    coachId: z.string(),
    coachName: z.string(),
    state: z.enum(lessonStates),
    version: z.number().int(),
    createdAt: z.string(),
    updatedAt: z.string(),
  })
  .meta({ id: 'Lesson' });
export type LessonOutput = z.infer<typeof lessonOutput>;

/** Splits "dumbbells, mat" from a form field into a list. */
export const commaList = (value: unknown) =>
  typeof value === 'string' ? value.split(',').map((s) => s.trim()).filter(Boolean) : value;

export const lessonListOutput = z.object({ lessons: z.array(lessonOutput) }).meta({ id: 'Lessons' });
export type LessonListOutput = z.infer<typeof lessonListOutput>;
