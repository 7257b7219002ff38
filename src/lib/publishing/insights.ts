import type { Chapter } from './chapters';

/** One member's playback of a class, as the insights need it. */
export interface MemberPlayback {
  userId: string;
  positionSeconds: number;
  finished: boolean;
  watchedSpans: [number, number][];
}

/** A stored jump (seek or chapter event) of one member: where they were and where they went. */
export interface SkipEvent {
  userId: string;
  fromSeconds: number;
  atSeconds: number;
}

export interface ChapterInsight {
  index: number;
  title: string;
  /** Members whose last position (unfinished) lies in this chapter. */
  left: number;
  /** Members who skipped this chapter (see SKIP_RULE): at most one per member. */
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

/**
 * What counts as a skip (shown beside the chart on the insights page):
 * a member skipped a chapter when a forward jump of theirs (a seek or a chapter jump) passed
 * over more than half of it, or over part of it and landed after its end, and, with everything
 * they have watched of this version, less than half of the chapter is watched. Each member counts once per chapter.
 * Resuming is therefore not a skip: a Resume jump passes over what the member already watched
 * in an earlier session. Jumps backwards, and nudges of 1 s or less, are never skips.
 */
export const SKIP_RULE =
  '“Skipped” counts members who jumped forward past a chapter (or over more than half of it) and have watched less than half of it. Resuming where you stopped is not a skip, and each member counts once per chapter.';
export const SKIP_UNWATCHED_SHARE = 0.5;
const NUDGE_SECONDS = 1;

/** Seconds of [start, end) covered by merged, sorted spans. */
function coveredSeconds(spans: readonly [number, number][], start: number, end: number): number {
  let covered = 0;
  for (const [a, b] of spans) covered += Math.max(0, Math.min(b, end) - Math.max(a, start));
  return covered;
}

/** Starts, finishes, median watch time, and where members leave or skip, per chapter. */
export function classInsights(chapters: readonly Chapter[], playbacks: readonly MemberPlayback[], jumps: readonly SkipEvent[]): ClassInsights {
  const rows: ChapterInsight[] = chapters.map((c) => ({ index: c.index, title: c.title, left: 0, skipped: 0 }));
  for (const p of playbacks) {
    if (p.finished) continue;
    const i = chapterIndexAt(chapters, p.positionSeconds);
    if (i >= 0) rows[i]!.left++;
  }
  const watchedBy = new Map(playbacks.map((p) => [p.userId, p.watchedSpans]));
  const skippedBy = chapters.map(() => new Set<string>());
  for (const j of jumps) {
    if (j.atSeconds <= j.fromSeconds + NUDGE_SECONDS) continue; // backwards or a nudge
    const watched = watchedBy.get(j.userId) ?? [];
    for (const c of chapters) {
      const length = c.endSeconds - c.startSeconds;
      const jumpedOver = Math.max(0, Math.min(j.atSeconds, c.endSeconds) - Math.max(j.fromSeconds, c.startSeconds));
      // Landing early in a chapter is starting it, not skipping it.
      const leftBehind = jumpedOver > 0 && (j.atSeconds >= c.endSeconds || jumpedOver > length * SKIP_UNWATCHED_SHARE);
      if (!leftBehind || length <= 0) continue;
      const unwatched = length - coveredSeconds(watched, c.startSeconds, c.endSeconds);
      if (unwatched > length * SKIP_UNWATCHED_SHARE) skippedBy[c.index]!.add(j.userId);
    }
  }
  for (const c of chapters) rows[c.index]!.skipped = skippedBy[c.index]!.size;
  return {
    starts: playbacks.length,
    finishes: playbacks.filter((p) => p.finished).length,
    medianWatchSeconds: median(playbacks.map((p) => p.watchedSpans.reduce((sum, [a, b]) => sum + (b - a), 0))),
    chapters: rows,
  };
}
