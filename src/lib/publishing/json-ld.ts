import type { Chapter } from './chapters';
import { formatIsoDuration } from '../time/format-time';
import { temporalFragment } from './media-fragment';

/**
 * schema.org VideoObject for a class page: `duration` in ISO 8601, and one `Clip` per chapter
 * with `startOffset`/`endOffset` in seconds and a URL that opens the class at that chapter.
 */
export function classJsonLd(input: {
  title: string;
  description: string;
  pageUrl: string;
  posterUrl: string;
  publishedAt: string;
  durationSeconds: number;
  chapters: Chapter[];
}) {
  return {
    '@context': 'https://schema.org',
    '@type': 'VideoObject',
    name: input.title,
    description: input.description || input.title,
    thumbnailUrl: input.posterUrl,
    uploadDate: input.publishedAt,
    duration: formatIsoDuration(input.durationSeconds),
    url: input.pageUrl,
    hasPart: input.chapters.map((c) => ({
      '@type': 'Clip',
      name: c.title,
      startOffset: Number(c.startSeconds.toFixed(3)),
      endOffset: Number(c.endSeconds.toFixed(3)),
      url: `${input.pageUrl}${temporalFragment(c.startSeconds)}`,
    })),
  };
}
