import type { Chapter } from './chapters';

/** Where a published version's chapter thumbnail lives inside the recording's media folder. */
export const chapterThumbnailPath = (versionId: string, chapterIndex: number) => `chapters/${versionId}/${chapterIndex + 1}.jpg`;

/** Where an uploaded cover lives inside the recording's media folder (one new id per upload). */
export const uploadedCoverPath = (coverId: string) => `cover/${coverId}.jpg`;

/** Media paths a cover may have (checked again when a link is asked for). */
export const COVER_PATH = /^(chapters\/[0-9a-f-]{36}\/\d{1,4}\.jpg|cover\/[0-9a-f-]{36}\.jpg)$/;

/**
 * The chapter a class shows when nobody chose a cover: the first work chapter, because it shows
 * the class being taught (a warm-up, rest or talk picture says little about the class). A class
 * with no work chapter takes its first chapter; never an arbitrary frame of the recording.
 */
export function defaultCoverChapter(chapters: readonly Pick<Chapter, 'index' | 'kind'>[]): number | null {
  return (chapters.find((c) => c.kind === 'work') ?? chapters[0])?.index ?? null;
}

/** Largest cover upload we read (5 MiB): a phone photo as JPEG is 2–4 MB. Common practice, no source. */
export const MAX_COVER_UPLOAD_BYTES = 5 * 1024 * 1024;
/** Covers are stored as JPEG of this size at most (16:9, cropped to fill): enough for a card and the player poster. */
export const COVER_WIDTH = 1280;
export const COVER_HEIGHT = 720;

/** The app's link to a cover (the media route checks who may see it, then redirects to storage). */
export const coverUrl = (recordingId: string | null | undefined, coverPath: string | null | undefined): string | null =>
  recordingId && coverPath && COVER_PATH.test(coverPath) ? `/media/${recordingId}/${coverPath}` : null;
