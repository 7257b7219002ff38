import type { Chapter } from './chapters';

/** One member's playback of a class, as the insights need it. */
export interface MemberPlayback {
  positionSeconds: number;
  finished: boolean;
  watchedSpans: [number, number][];
}

/** A jump that moved forward over part of the class. */
export interface SkipEvent {
  fromSeconds: number;
  atSeconds: number;
}

export interface ChapterInsight {
  index: number;
  title: string;
  /** Members whose last position (unfinished) lies in this chapter. */
  left: number;
  /** Forward jumps that passed over this whole chapter, or out of it before its end. */
  skipped: number;
}

export interface ClassInsights {
  starts: number;
  finishes: number;
  /** Median seconds watched per member who started (null without starts). */
  medianWatchSeconds: number | null;
  chapters: ChapterInsight[];
}

const chapterIndexAt = (chapters: readonly Chapter[], t: number) => {
  let found = -1;
  for (const c of chapters) if (c.startSeconds <= t) found = c.index;
  return found;
};

/** The median of a list of numbers (mean of the two middle values for an even count). */
export function median(values: readonly number[]): number | null {
  if (!values.length) return null;
  const s = [...values].sort((a, b) => a - b);
  const mid = s.length >> 1;
  return s.length % 2 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2;
}

/** Starts, finishes, median watch time, and where members leave or skip, per chapter. */
export function classInsights(chapters: readonly Chapter[], playbacks: readonly MemberPlayback[], skips: readonly SkipEvent[]): ClassInsights {
  const rows: ChapterInsight[] = chapters.map((c) => ({ index: c.index, title: c.title, left: 0, skipped: 0 }));
  for (const p of playbacks) {
    if (p.finished) continue;
    const i = chapterIndexAt(chapters, p.positionSeconds);
    if (i >= 0) rows[i]!.left++;
  }
  for (const s of skips) {
    if (s.atSeconds <= s.fromSeconds + 1) continue; // backwards or a nudge: not a skip
    for (const c of chapters) {
      // A chapter counts as skipped when the jump leaves it early or passes over it entirely.
      const leftEarly = c.startSeconds <= s.fromSeconds && s.fromSeconds < c.endSeconds && s.atSeconds >= c.endSeconds;
      const passedOver = s.fromSeconds < c.startSeconds && s.atSeconds >= c.endSeconds;
      if (leftEarly || passedOver) rows[c.index]!.skipped++;
    }
  }
  return {
    starts: playbacks.length,
    finishes: playbacks.filter((p) => p.finished).length,
    medianWatchSeconds: median(playbacks.map((p) => p.watchedSpans.reduce((sum, [a, b]) => sum + (b - a), 0))),
    chapters: rows,
  };
}
