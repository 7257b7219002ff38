import { z } from 'zod';

/** The error body every API route answers with on failure (some add fields, e.g. `currentVersion` on 409). */
export const errorOutput = z
  .object({
    error: z
      .object({
        code: z.string().describe('Machine-readable reason, e.g. invalid_input, conflict'),
        message: z.string().describe('What happened and what to do next, in plain language'),
        fields: z.record(z.string(), z.string()).optional().describe('Message per invalid field'),
      })
      .passthrough(),
  })
  .meta({ id: 'Error' });
export type ErrorOutput = z.infer<typeof errorOutput>;

/** A timeline import's 400: the usual error body; a file with problems adds them by line. */
export const timelineImportErrorOutput = z
  .object({
    error: errorOutput.shape.error.extend({ errors: z.array(z.object({ line: z.number().int(), message: z.string() })).optional() }),
  })
  .meta({ id: 'TimelineImportError' });
