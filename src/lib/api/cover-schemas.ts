import { z } from 'zod';

/** Choosing a class's cover: one chapter's thumbnail of the published version, or back to the default. */
export const coverChoiceInput = z
  .discriminatedUnion('source', [
    z.object({
      source: z.literal('chapter'),
      chapter: z.number({ error: 'Choose a chapter by its number.' }).int().min(1, { error: 'Chapters are numbered from 1.' }),
    }),
    z.object({ source: z.literal('default').describe('The first work chapter’s thumbnail') }),
  ], { error: 'Say where the cover comes from: "chapter" or "default".' })
  .meta({ id: 'CoverChoiceInput' });
export type CoverChoiceInput = z.infer<typeof coverChoiceInput>;

export const coverOutput = z
  .object({
    coverUrl: z.string().nullable().describe('The app link of the cover picture; null while the class has none'),
    chosen: z.boolean().describe('Whether staff chose it (otherwise it is the first work chapter’s thumbnail)'),
    chapters: z
      .array(z.object({ number: z.number().int(), title: z.string(), kind: z.string(), thumbnailUrl: z.string() }))
      .describe('Chapters of the published version whose thumbnail can be the cover (empty before the first publish)'),
  })
  .meta({ id: 'Cover' });
export type CoverOutput = z.infer<typeof coverOutput>;

/** "Use this frame as cover": the moment of the class's recording to take the picture at. */
export const coverFrameInput = z
  .object({
    atSeconds: z
      .number({ error: 'Say where in the recording the picture is, in seconds from its start.' })
      .finite({ error: 'Say where in the recording the picture is, in seconds from its start.' })
      .min(0, { error: 'A moment of the recording starts at 0 seconds or later.' })
      .describe('Seconds from the start of the class’s current recording; must be before its end'),
  })
  .meta({ id: 'CoverFrameInput' });
export type CoverFrameInput = z.infer<typeof coverFrameInput>;

export const coverFrameOutput = z
  .object({
    id: z.string().describe('The request; ask for it again to follow its progress'),
    atSeconds: z.number(),
    state: z.enum(['waiting', 'working', 'done', 'failed']).describe('waiting for the worker, being taken, the cover now, or failed'),
    message: z.string().nullable().describe('Why it failed, and what to do next; null otherwise'),
    coverUrl: z.string().nullable().describe('The app link of the picture once done'),
  })
  .meta({ id: 'CoverFrame' });
export type CoverFrameOutput = z.infer<typeof coverFrameOutput>;
