/**
 * The local draft: unsaved marks kept in the browser's storage so a closed tab or a crash
 * loses nothing. Pure apart from the Storage object passed in (localStorage in the browser).
 */
import { z } from 'zod';
import { timelineContentSchema, type Timeline } from '../timeline/timeline-schema';

export interface StoredDraft {
  /** The server version the draft was based on. */
  baseVersion: number;
  /** When it was written, ISO 8601. */
  savedAt: string;
  timeline: Timeline;
}

const draftSchema = z.object({ baseVersion: z.number().int().nonnegative(), savedAt: z.string(), timeline: timelineContentSchema });

export const draftKey = (lessonId: string) => `roundmark:timeline-draft:${lessonId}`;

type StorageLike = Pick<Storage, 'getItem' | 'setItem' | 'removeItem'>;

export function writeDraft(storage: StorageLike, lessonId: string, draft: StoredDraft): void {
  try {
    storage.setItem(draftKey(lessonId), JSON.stringify(draft));
  } catch {
    // Storage full or refused (private mode): the explicit save still works.
  }
}

/** The stored draft, or null when there is none or it is not a valid timeline. */
export function readDraft(storage: StorageLike, lessonId: string): StoredDraft | null {
  try {
    const raw = storage.getItem(draftKey(lessonId));
    if (!raw) return null;
    const parsed = draftSchema.safeParse(JSON.parse(raw));
    return parsed.success ? parsed.data : null;
  } catch {
    return null;
  }
}

export function clearDraft(storage: StorageLike, lessonId: string): void {
  try {
    storage.removeItem(draftKey(lessonId));
  } catch {
    // nothing to do
  }
}
