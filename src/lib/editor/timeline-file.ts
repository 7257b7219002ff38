/**
 * Timeline files in the editor: read a CSV or WebVTT file with the same importers the API
 * uses (same limits and messages, so a file the server would refuse is refused here too), and
 * count what replacing the marks with it would change, for the preview before replacing.
 */
import { timelineFromCsv } from '../timeline/timeline-csv';
import { timelineFromWebVtt } from '../timeline/timeline-webvtt';
import type { ImportResult } from '../timeline/timeline-import';
import type { Timeline } from '../timeline/timeline-schema';
import { diffTimelines } from './timeline-diff';

/** Parses a file's text; the format follows the server's guess (a WebVTT file starts with WEBVTT). */
export function readTimelineFile(text: string): ImportResult {
  if (!text.trim()) return { ok: false, errors: [{ line: 0, message: 'The file is empty. Export a timeline as CSV or WebVTT and import that.' }] };
  return /^\uFEFF?WEBVTT/.test(text) ? timelineFromWebVtt(text) : timelineFromCsv(text);
}

export interface ImportPreview {
  segments: number;
  cues: number;
  /** Marks (segments and cues) only in the file, only in the editor, and in both but different. */
  added: number;
  removed: number;
  moved: number;
}

export function importPreview(current: Timeline, imported: Timeline): ImportPreview {
  const diff = diffTimelines(current, imported);
  return {
    segments: imported.segments.length,
    cues: imported.cues.length,
    added: diff.filter((d) => d.change === 'only-theirs').length,
    removed: diff.filter((d) => d.change === 'only-mine').length,
    moved: diff.filter((d) => d.change === 'changed').length,
  };
}

/** One line saying why nothing was imported (the first problem, and how many more). */
export function importRefusal(errors: readonly { line: number; message: string }[]): string {
  const first = errors[0];
  if (!first) return 'Nothing was imported.';
  return `Nothing was imported: ${first.line > 0 ? `line ${first.line}: ` : ''}${first.message}${errors.length > 1 ? ` (and ${errors.length - 1} more problems)` : ''}`;
}
