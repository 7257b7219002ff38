import { describe, expect, it } from 'vitest';
import { classInsights, median } from '~/lib/publishing/insights';
import type { Chapter } from '~/lib/publishing/chapters';

const chapters: Chapter[] = [
  { index: 0, title: 'Warm-up', kind: 'warmup', startSeconds: 0, endSeconds: 60 },
  { index: 1, title: 'Squat', kind: 'work', startSeconds: 60, endSeconds: 120 },
  { index: 2, title: 'Row', kind: 'work', startSeconds: 120, endSeconds: 180 },
  { index: 3, title: 'Cool-down', kind: 'cooldown', startSeconds: 180, endSeconds: 240 },
];

describe('class insights', () => {
  it('counts starts, finishes and where unfinished members stopped', () => {
    const result = classInsights(
      chapters,
      [
        { userId: 'm0', positionSeconds: 240, finished: true, watchedSpans: [[0, 240]] },
        { userId: 'm1', positionSeconds: 70, finished: false, watchedSpans: [[0, 70]] },
        { userId: 'm2', positionSeconds: 90, finished: false, watchedSpans: [[0, 30], [60, 90]] },
        { userId: 'm3', positionSeconds: 200, finished: false, watchedSpans: [[0, 200]] },
      ],
      [],
    );
    expect([result.starts, result.finishes]).toEqual([4, 1]);
    expect(result.chapters.map((c) => c.left)).toEqual([0, 2, 0, 1]);
    // Watched seconds 240, 70, 60, 200 -> median (70 + 200) / 2.
    expect(result.medianWatchSeconds).toBe(135);
  });

  // The skip rule is our own (SKIP_RULE in src/lib/publishing/insights.ts); members and times are invented.
  it('counts a member who jumped forward past a chapter and watched less than half of it', () => {
    const result = classInsights(chapters, [{ userId: 'a', positionSeconds: 140, finished: false, watchedSpans: [[0, 10], [130, 140]] }], [
      { userId: 'a', fromSeconds: 10, atSeconds: 130 }, // leaves warm-up at 10 s, passes over Squat, lands 10 s into Row
      { userId: 'a', fromSeconds: 150, atSeconds: 140 }, // backwards: not a skip
      { userId: 'a', fromSeconds: 100, atSeconds: 100.5 }, // a nudge: not a skip
    ]);
    // Warm-up 10/60 watched, Squat 0/60; Row is not skipped: the jump landed 10 s into it (starting it).
    expect(result.chapters.map((c) => c.skipped)).toEqual([1, 1, 0, 0]);
  });

  it('does not count a jump past a chapter the member had watched at least half of', () => {
    const result = classInsights(chapters, [{ userId: 'a', positionSeconds: 150, finished: false, watchedSpans: [[0, 40], [60, 90], [125, 150]] }], [
      { userId: 'a', fromSeconds: 40, atSeconds: 60 }, // warm-up 40/60 watched: not skipped
      { userId: 'a', fromSeconds: 90, atSeconds: 125 }, // Squat 30/60 watched: exactly half unwatched is not "more than half"; lands 5 s into Row
    ]);
    expect(result.chapters.map((c) => c.skipped)).toEqual([0, 0, 0, 0]);
  });

  it('does not count resuming: the Resume jump passes over what the member watched in an earlier session', () => {
    const result = classInsights(chapters, [{ userId: 'a', positionSeconds: 200, finished: false, watchedSpans: [[0, 200]] }], [
      { userId: 'a', fromSeconds: 0, atSeconds: 150 }, // Resume at 2:30, where they stopped last time
    ]);
    expect(result.chapters.map((c) => c.skipped)).toEqual([0, 0, 0, 0]);
  });

  it('counts a jump over more than half of a chapter that lands inside it', () => {
    const result = classInsights(chapters, [{ userId: 'a', positionSeconds: 115, finished: false, watchedSpans: [[0, 62], [110, 115]] }], [
      { userId: 'a', fromSeconds: 62, atSeconds: 110 }, // 48 of Squat's 60 s jumped over; 7 s watched
    ]);
    expect(result.chapters.map((c) => c.skipped)).toEqual([0, 1, 0, 0]);
  });

  it('counts each member once per chapter, so Skipped never exceeds the members who started', () => {
    const jumps = Array.from({ length: 12 }, (_, i) => ({ userId: i % 2 ? 'a' : 'b', fromSeconds: 5, atSeconds: 185 }));
    const result = classInsights(
      chapters,
      [
        { userId: 'a', positionSeconds: 190, finished: false, watchedSpans: [[0, 5], [185, 190]] },
        { userId: 'b', positionSeconds: 190, finished: false, watchedSpans: [[0, 5], [185, 190]] },
      ],
      jumps,
    );
    expect(result.chapters.map((c) => c.skipped)).toEqual([2, 2, 2, 0]); // both land 5 s into Cool-down: not skipped
    for (const c of result.chapters) expect(c.skipped).toBeLessThanOrEqual(result.starts);
  });

  it('takes the median of odd and even counts and of nothing', () => {
    expect(median([3, 1, 2])).toBe(2);
    expect(median([4, 1, 3, 2])).toBe(2.5);
    expect(median([])).toBeNull();
  });
});
