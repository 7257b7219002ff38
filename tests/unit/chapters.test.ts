import { describe, expect, it } from 'vitest';
import { WebVTTParser } from 'webvtt-parser';
import { buildChapters, chaptersToVtt } from '~/lib/publishing/chapters';
import { isFinished, mergeSpans, workWatchedSeconds } from '~/lib/publishing/finish-rule';
import type { Segment } from '~/lib/timeline/timeline-schema';

const seg = (id: string, kind: Segment['kind'], start: number, end: number, extra: Partial<Segment> = {}): Segment => ({
  id, kind, startSeconds: start, endSeconds: end, ...extra,
});
const timeline: Segment[] = [
  seg('i', 'intro', 0, 15),
  seg('wu', 'warmup', 15, 255),
  seg('w1', 'work', 255, 295, { exercise: 'Goblet squat', round: 1 }),
  seg('r1', 'rest', 295, 315, { round: 1 }),
  seg('w2', 'work', 315, 355, { exercise: 'Push-up', round: 1 }),
  seg('rb', 'round-break', 355, 415),
  seg('w3', 'work', 415, 455, { exercise: 'Goblet squat', round: 2 }),
  seg('cd', 'cooldown', 455.5, 635),
];

describe('chapters', () => {
  it('folds rests into the chapter before them and titles moves with their round', () => {
    const chapters = buildChapters(timeline);
    expect(chapters.map((c) => c.title)).toEqual([
      'Welcome', 'Warm-up', 'Goblet squat · round 1 of 2', 'Push-up · round 1 of 2', 'Round break', 'Goblet squat · round 2 of 2', 'Cool-down',
    ]);
    expect(chapters[2]).toMatchObject({ startSeconds: 255, endSeconds: 315 });
    // Back to back: each chapter ends where the next starts (the 0.5 s gap is closed).
    for (let i = 1; i < chapters.length; i++) expect(chapters[i]!.startSeconds).toBe(chapters[i - 1]!.endSeconds);
  });

  it('writes a chapters file a spec-following parser reads back exactly', () => {
    const chapters = buildChapters(timeline);
    const vtt = chaptersToVtt(chapters);
    // webvtt-parser 2.2.0 implements the W3C WebVTT parsing algorithm; "chapters" mode rejects tags in cue text.
    const parsed = new WebVTTParser().parse(vtt, 'chapters');
    expect(parsed.errors).toEqual([]);
    expect(parsed.cues.map((c: { startTime: number; endTime: number; text: string }) => [c.startTime, c.endTime, c.text])).toEqual(
      chapters.map((c) => [c.startSeconds, c.endSeconds, c.title]),
    );
    // W3C WebVTT §4.1: cue identifiers are unique; §4.5.1 chapter cues do not overlap (the parser does not check these).
    const ids = parsed.cues.map((c: { id: string }) => c.id);
    expect(new Set(ids).size).toBe(ids.length);
    for (let i = 1; i < parsed.cues.length; i++) expect(parsed.cues[i]!.startTime).toBeGreaterThanOrEqual(parsed.cues[i - 1]!.endTime);
  });
});

describe('the finish rule (house rule: 90 % of work intervals watched)', () => {
  const work = 120; // three 40 s work intervals above
  it('counts overlapping watched spans once', () => {
    expect(mergeSpans([[0, 10], [5, 20], [30, 40]])).toEqual([[0, 20], [30, 40]]);
    expect(workWatchedSeconds(timeline, [[250, 300], [260, 290]])).toBe(40);
  });
  it('finishes at 90 % of the work and not below', () => {
    expect(0.9 * work).toBe(108);
    expect(isFinished(timeline, [[255, 295], [315, 355], [415, 442]])).toBe(false); // 40 + 40 + 27 = 107 s
    expect(isFinished(timeline, [[255, 295], [315, 355], [415, 443]])).toBe(true); // 108 s
  });
  it('does not count warm-up, rests or talk', () => {
    expect(isFinished(timeline, [[0, 255], [295, 315], [355, 415], [455, 635]])).toBe(false);
  });
});
