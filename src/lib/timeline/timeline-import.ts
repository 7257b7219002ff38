/** Shared parts of the CSV and WebVTT timeline importers. */
import type { z } from 'zod';
import { MAX_CUES, MAX_SEGMENTS, type Timeline } from './timeline-schema';

export interface ImportError {
  /** 1-based line of the file; 0 for a problem with the file as a whole. */
  line: number;
  message: string;
}

/** Either the whole timeline, or the reasons nothing was imported. */
export type ImportResult = { ok: true; timeline: Timeline } | { ok: false; errors: ImportError[] };

/**
 * The last step of every importer: a file replaces the whole timeline, so it must hold what a
 * save may hold (at most MAX_SEGMENTS segments and MAX_CUES cues) and at least one segment: a
 * file without any would silently empty the timeline.
 */
export function importedTimeline(timeline: Timeline): ImportResult {
  const errors: ImportError[] = [];
  const { segments, cues } = timeline;
  if (segments.length === 0) {
    errors.push({ line: 0, message: 'The file has no segments, so importing it would empty the timeline. Check that it is a timeline export with one row (or chapter) per segment.' });
  }
  if (segments.length > MAX_SEGMENTS) {
    errors.push({ line: 0, message: `The file has ${segments.length} segments; a timeline holds at most ${MAX_SEGMENTS}, as when saving. Split the class or merge segments.` });
  }
  if (cues.length > MAX_CUES) {
    errors.push({ line: 0, message: `The file has ${cues.length} cues; a timeline holds at most ${MAX_CUES}, as when saving. Remove some cues.` });
  }
  return errors.length > 0 ? { ok: false, errors } : { ok: true, timeline };
}

/** Turns a zod error into plain messages, prefixed by the field when it helps. */
export function issueMessages(error: z.ZodError): string[] {
  return error.issues.map((issue) => issue.message);
}

/**
 * Gives every item without an id a generated one (`prefix` + a number) that no item in the
 * file already uses, so a file with some ids and some blanks still imports.
 */
export function fillIds<T extends { id?: string }>(items: T[], prefix: string): (T & { id: string })[] {
  const taken = new Set(items.map((i) => i.id).filter((id): id is string => id !== undefined && id !== ''));
  let counter = 1;
  return items.map((item) => {
    if (item.id !== undefined && item.id !== '') return item as T & { id: string };
    while (taken.has(`${prefix}${counter}`)) counter++;
    const id = `${prefix}${counter}`;
    taken.add(id);
    return { ...item, id };
  });
}

/** Reports the second and later uses of an id, with their lines. */
export function duplicateIdErrors(items: readonly { id: string; line: number }[], what: string): ImportError[] {
  const first = new Map<string, number>();
  const errors: ImportError[] = [];
  for (const item of items) {
    const seen = first.get(item.id);
    if (seen !== undefined) errors.push({ line: item.line, message: `The ${what} id "${item.id}" is already used on line ${seen}; ids must be unique.` });
    else first.set(item.id, item.line);
  }
  return errors;
}
