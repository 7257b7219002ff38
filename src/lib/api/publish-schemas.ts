import { z } from 'zod';

export const publishInput = z
  .object({
    acknowledgeWarnings: z.boolean().default(false).describe('Confirms the timing check’s warnings were reviewed; recorded with the version.'),
    publishAt: z.iso.datetime({ offset: true }).optional().describe('Schedule the publish for this time instead of now (owner only).'),
  })
  .meta({ id: 'PublishInput' });
export type PublishInput = z.infer<typeof publishInput>;

export const progressInput = z
  .object({
    positionSeconds: z.number().nonnegative().max(24 * 3600),
    /** Spans watched since the last report, as [from, to] seconds. */
    watched: z.array(z.tuple([z.number().nonnegative(), z.number().nonnegative()])).max(200).default([]),
    event: z.enum(['start', 'progress', 'seek', 'chapter', 'leave']).default('progress'),
    fromSeconds: z.number().nonnegative().optional(),
  })
  .meta({ id: 'ProgressInput' });
export type ProgressInput = z.infer<typeof progressInput>;
