import type { APIRoute } from 'astro';
import { timelineImportOutput } from '~/lib/api/timeline-schemas';
import { MAX_TIMELINE_FILE_BYTES, timelineImportQuery } from '~/lib/api/timeline-file-schemas';
import { timelineFromCsv } from '~/lib/timeline/timeline-csv';
import { timelineFromWebVtt } from '~/lib/timeline/timeline-webvtt';
import { app } from '~/server/app';
import { AppError } from '~/server/errors';
import { answer, endpoint, parseWith, readBodyText } from '~/server/http/api';
import { requireActor } from '~/server/http/guards';
import { saveClassTimeline } from '~/server/use-cases/class-marks';

/** Replaces the timeline with a CSV or WebVTT chapters file; a bad file imports nothing. */
export const POST: APIRoute = endpoint(async ({ locals, params, request, url }) => {
  const actor = requireActor(locals);
  const query = parseWith(timelineImportQuery, Object.fromEntries(url.searchParams));
  const text = await readBodyText(request, MAX_TIMELINE_FILE_BYTES);
  if (!text.trim()) throw new AppError('invalid_input', 'The file is empty. Export a timeline as CSV or WebVTT and import that.');
  const format = query.format ?? (/^\uFEFF?WEBVTT/.test(text) ? 'vtt' : 'csv');
  const result = format === 'vtt' ? timelineFromWebVtt(text) : timelineFromCsv(text);
  if (!result.ok) {
    const first = result.errors[0]!;
    throw new AppError(
      'invalid_input',
      `Nothing was imported: ${first.line > 0 ? `line ${first.line}: ` : ''}${first.message}${result.errors.length > 1 ? ` (and ${result.errors.length - 1} more problems)` : ''}`,
      undefined,
      { errors: result.errors },
    );
  }
  const saved = await saveClassTimeline(actor, app(), { lessonId: params.id!, version: query.version, timeline: result.timeline });
  return answer(timelineImportOutput, { ...saved, segments: result.timeline.segments.length, cues: result.timeline.cues.length });
});

