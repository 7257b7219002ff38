import { z } from 'zod';

/** Play positions: never negative, never past a day (the longest class); the service also clamps them to the class's length. */
const playSeconds = z
  .number()
  .nonnegative()
  .max(24 * 3600, { error: 'A position is at most 24 hours into the class.' })
  // Stored as 4-byte floats, which cannot hold tiny values such as 1e-300 (they underflow).
  .refine((seconds) => seconds === 0 || seconds >= 0.001, { error: 'A position is 0 or at least a millisecond into the class.' });

export const publishInput = z
  .object({
    acknowledgeWarnings: z.boolean().default(false).describe('Confirms the timing check’s warnings were reviewed; recorded with the version.'),
    publishAt: z.iso.datetime({ offset: true }).optional().describe('Schedule the publish for this time instead of now (owner only).'),
  })
  .meta({ id: 'PublishInput' });
export type PublishInput = z.infer<typeof publishInput>;

export const progressInput = z
  .object({
    positionSeconds: playSeconds,
    /** Spans watched since the last report, as [from, to] seconds. */
    watched: z.array(z.tuple([playSeconds, playSeconds])).max(200).default([]),
    event: z.enum(['start', 'progress', 'seek', 'chapter', 'leave']).default('progress'),
    fromSeconds: playSeconds.optional(),
  })
  .meta({ id: 'ProgressInput' });
export type ProgressInput = z.infer<typeof progressInput>;

/** The publishing panel's form: which button was pressed, and its fields as the browser posts them. */
export const publishFormInput = z.object({
  lessonId: z.string().min(1),
  intent: z.enum(['publish', 'schedule', 'unpublish', 'archive'], { error: 'Choose what to do.' }),
  acknowledgeWarnings: z
    .string()
    .optional()
    .transform((v) => v === 'true'),
  /** `datetime-local` value, read in the studio's time zone (labelled beside the field). */
  publishAt: z.string().optional(),
});
export type PublishFormInput = z.infer<typeof publishFormInput>;

export const publishedOutput = z.object({ versionId: z.string().uuid(), number: z.number().int() }).meta({ id: 'Published' });
export const scheduledOutput = z.object({ scheduledFor: z.string().describe('ISO 8601 instant') }).meta({ id: 'PublishScheduled' });
export const unpublishedOutput = z.object({ state: z.literal('draft') });
export const archivedOutput = z.object({ state: z.literal('archived') });

export const versionOutput = z
  .object({
    id: z.string(),
    number: z.number().int(),
    publishedAt: z.string().describe('ISO 8601 instant'),
    warningsAcknowledged: z.boolean(),
    publishedBy: z.string().nullable().describe('Name of who published it; null when that account is gone'),
  })
  .meta({ id: 'Version' });
export const versionListOutput = z.object({ versions: z.array(versionOutput) }).meta({ id: 'Versions' });

/** `GET …/progress`: where the member stopped. */
export const progressOutput = z.object({ positionSeconds: z.number(), finished: z.boolean() }).meta({ id: 'Progress' });

/** What the member did in a class they just finished (shown once, at the end). */
export const finishSummarySchema = z
  .object({ watchedSeconds: z.number(), workWatchedSeconds: z.number(), workSeconds: z.number(), roundsDone: z.number().int() })
  .meta({ id: 'FinishSummary' });
export type FinishSummary = z.infer<typeof finishSummarySchema>;

/** `POST …/progress`: the stored position, and the summary when this report finished the class. */
export const progressRecordedOutput = progressOutput
  .extend({ justFinished: z.boolean(), summary: finishSummarySchema.nullable() })
  .meta({ id: 'ProgressRecorded' });
export type ProgressRecordedOutput = z.infer<typeof progressRecordedOutput>;
