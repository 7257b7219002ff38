/**
 * The exercise list of an AMRAP reaches the marked span: the editor, the chapters and the clock
 * read it from the plan's AMRAP block the span stands for. Plans and marks are invented for the test.
 */
import { describe, expect, it } from 'vitest';
import { buildChapters } from '~/lib/publishing/chapters';
import { amrapExercisesBySegment } from '~/lib/timing/amrap-exercises';
import { edit, plan, timelineFromPlan, without } from './timing-fixtures';

// Warm-up 0–120, AMRAP A 120–420 (5:00), talk 420–480, AMRAP B 480–780 (5:00), cool-down 780–900.
const twoAmraps = plan({
  blocks: [
    { kind: 'warmup', seconds: 120 },
    { kind: 'amrap', seconds: 300, exercises: ['Burpee', 'Air squat', 'Push-up'] },
    { kind: 'talk', seconds: 60 },
    { kind: 'amrap', seconds: 300, exercises: ['Kettlebell swing', 'Sit-up'] },
    { kind: 'cooldown', seconds: 120 },
  ],
});

describe('AMRAP exercises on the marked span', () => {
  it('each marked AMRAP span gets the list of the block it stands for', () => {
    const t = timelineFromPlan(twoAmraps);
    // s1 and s3 are the two AMRAP spans.
    expect(Object.fromEntries(amrapExercisesBySegment(twoAmraps, t.segments))).toEqual({
      s1: ['Burpee', 'Air squat', 'Push-up'],
      s3: ['Kettlebell swing', 'Sit-up'],
    });
  });

  it('a missing first AMRAP does not hand its list to the second', () => {
    const t = without(timelineFromPlan(twoAmraps), 's1');
    expect(Object.fromEntries(amrapExercisesBySegment(twoAmraps, t.segments))).toEqual({ s3: ['Kettlebell swing', 'Sit-up'] });
  });

  it('a span marked AMRAP with no AMRAP in the plan gets no list; other work gets none either', () => {
    const circuit = plan({ blocks: [{ kind: 'circuit', rounds: 1, stations: [{ exercise: 'Row', workSeconds: 60, restSeconds: 0 }] }] });
    const t = edit(timelineFromPlan(circuit), 's0', { format: 'amrap', exercise: undefined });
    expect(amrapExercisesBySegment(circuit, t.segments).size).toBe(0);
    expect(amrapExercisesBySegment(twoAmraps, timelineFromPlan(circuit).segments).size).toBe(0);
  });

  it('the AMRAP chapter carries the list; other chapters do not', () => {
    const t = timelineFromPlan(twoAmraps);
    const chapters = buildChapters(t.segments, amrapExercisesBySegment(twoAmraps, t.segments));
    expect(chapters.map((c) => [c.title, c.exercises ?? null])).toEqual([
      ['Warm-up', null],
      ['AMRAP 5:00 — round as many as you can', ['Burpee', 'Air squat', 'Push-up']],
      ['Coach talk', null],
      ['AMRAP 5:00 — round as many as you can', ['Kettlebell swing', 'Sit-up']],
      ['Cool-down', null],
    ]);
    // Without the plan's lists (versions published before them) the chapters are as before.
    expect(buildChapters(t.segments).every((c) => c.exercises === undefined)).toBe(true);
  });
});
