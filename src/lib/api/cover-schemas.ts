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
