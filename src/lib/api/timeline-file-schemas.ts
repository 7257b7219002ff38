import { z } from 'zod';
import { INT4_MAX } from './text-rules';

/** Largest timeline file accepted for import (a 3-hour class with thousands of marks is ~500 KB). */
export const MAX_TIMELINE_FILE_BYTES = 2 * 1024 * 1024;

export const timelineImportQuery = z
  .object({
    version: z.coerce
      .number({ error: 'Add ?version= with the timeline version you are replacing.' })
      .int()
      .nonnegative()
      .max(INT4_MAX, { error: 'That version does not exist; reload the timeline.' })
      .describe('The timeline version the import replaces; a stale one answers 409.'),
    format: z.enum(['csv', 'vtt']).optional().describe('File format; guessed from the content when left out.'),
  })
  .meta({ id: 'TimelineImportQuery' });

export const timelineExportQuery = z
  .object({ format: z.enum(['csv', 'vtt'], { error: 'Choose format=csv or format=vtt.' }) })
  .meta({ id: 'TimelineExportQuery' });

/** A timeline file as sent or downloaded: CSV with a header row, or WebVTT chapters. */
export const timelineFileText = z.string().describe('CSV (header row) or WebVTT chapters');
