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
        { positionSeconds: 240, finished: true, watchedSpans: [[0, 240]] },
        { positionSeconds: 70, finished: false, watchedSpans: [[0, 70]] },
        { positionSeconds: 90, finished: false, watchedSpans: [[0, 30], [60, 90]] },
        { positionSeconds: 200, finished: false, watchedSpans: [[0, 200]] },
      ],
      [],
    );
    expect([result.starts, result.finishes]).toEqual([4, 1]);
    expect(result.chapters.map((c) => c.left)).toEqual([0, 2, 0, 1]);
    // Watched seconds 240, 70, 60, 200 -> median (70 + 200) / 2.
    expect(result.medianWatchSeconds).toBe(135);
  });

  it('counts a forward jump against the chapter it left and every chapter it passed over', () => {
    const result = classInsights(chapters, [], [
      { fromSeconds: 10, atSeconds: 130 }, // leaves warm-up early, passes over Squat
      { fromSeconds: 150, atSeconds: 140 }, // backwards: not a skip
      { fromSeconds: 100, atSeconds: 100.5 }, // a nudge: not a skip
    ]);
    expect(result.chapters.map((c) => c.skipped)).toEqual([1, 1, 0, 0]);
  });

  it('takes the median of odd and even counts and of nothing', () => {
    expect(median([3, 1, 2])).toBe(2);
    expect(median([4, 1, 3, 2])).toBe(2.5);
    expect(median([])).toBeNull();
  });
});
