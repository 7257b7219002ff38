import { z } from 'zod';

/** Play positions: never negative, never past a day (the longest class); the service also clamps them to the class's length. */
const playSeconds = z.number().nonnegative().max(24 * 3600, { error: 'A position is at most 24 hours into the class.' });

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
  /** `datetime-local` value, in the coach's own time zone. */
  publishAt: z.string().optional(),
  /** The browser's `Date#getTimezoneOffset()` in minutes, so the server can read the local time. */
  timezoneOffset: z.coerce.number().int().min(-900).max(900).default(0),
});
export type PublishFormInput = z.infer<typeof publishFormInput>;

/** A `datetime-local` value ("2026-03-01T07:30") entered at a UTC offset, as an instant; null when unreadable. */
export function localTimeToInstant(local: string | undefined, timezoneOffsetMinutes: number): Date | null {
  if (!local || !/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}$/.test(local)) return null;
  const at = new Date(Date.parse(`${local}:00Z`) + timezoneOffsetMinutes * 60_000);
  return Number.isNaN(at.getTime()) ? null : at;
}
