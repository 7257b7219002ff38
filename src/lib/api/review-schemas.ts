import { z } from 'zod';
import { noControlCharacters } from './text-rules';

export const REVIEW_NOTE_MAX = 1000;

const note = (field: string) =>
  z
    .string({ error: `${field} must be text.` })
    .trim()
    .max(REVIEW_NOTE_MAX, { error: `${field} can be at most 1,000 characters.` })
    .regex(...noControlCharacters(field, { multiline: true }));

/** An editor's hand-off: the class is ready for a coach or the owner to review, with an optional note. */
export const readyForReviewInput = z
  .object({ note: note('The note').default('').describe('What the reviewer should know (optional)') })
  .meta({ id: 'ReadyForReviewInput' });
export type ReadyForReviewInput = z.infer<typeof readyForReviewInput>;

/** A coach or the owner sends the class back to whoever prepared it, saying what needs another look. */
export const sendBackInput = z
  .object({
    note: note('The note').min(1, { error: 'Say what needs another look, so whoever prepared the class knows what to change.' }),
  })
  .meta({ id: 'SendBackInput' });
export type SendBackInput = z.infer<typeof sendBackInput>;

/** The open hand-off of a class: who prepared it, when, and their note. */
export const reviewRequestOutput = z
  .object({
    lessonId: z.string(),
    title: z.string(),
    preparedBy: z.string().nullable().describe('Name of who prepared it; null when that account is gone'),
    requestedAt: z.string().describe('ISO 8601 instant'),
    note: z.string(),
  })
  .meta({ id: 'ReviewRequest' });
export type ReviewRequestOutput = z.infer<typeof reviewRequestOutput>;

export const sentBackOutput = z
  .object({ sentBackTo: z.string().nullable().describe('Name of who prepared it and is told; null when that account is gone') })
  .meta({ id: 'SentBack' });
export type SentBackOutput = z.infer<typeof sentBackOutput>;
