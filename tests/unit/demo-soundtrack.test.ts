// The demo recordings' soundtrack (invented demo content): the change signal sits on every
// planned change of the marked timeline, on the recording's frame grid, and nowhere else.
import { describe, expect, it } from 'vitest';
import { expandPlan } from '~/lib/plan/expand-plan';
import { planSchema } from '~/lib/plan/plan-schema';
import { demoSoundtrackScore, demoSpans } from '~/scripts/demo/demo-spans';
import { demoTimeline, DEMO_INTRO_SECONDS } from '~/scripts/demo/demo-timelines';

const plan = planSchema.parse({
  blocks: [
    { kind: 'warmup', seconds: 30 },
    { kind: 'intervals', exercise: 'Air squat', sets: 3, workSeconds: 20, restSeconds: 10 },
    { kind: 'cooldown', seconds: 30 },
  ],
});
const timeline = demoTimeline(expandPlan(plan));
const mediaSeconds = Math.max(...timeline.segments.map((s) => s.endSeconds));
const spans = demoSpans(timeline.segments, mediaSeconds);
const planned = timeline.segments.filter((s) => s.kind !== 'intro' && s.kind !== 'outro');
const expected = [...planned.map((s) => s.startSeconds), planned.at(-1)!.endSeconds];

describe('demo soundtrack', () => {
  it('beeps at every planned change and the end of the last part, not at the welcome or the goodbye', () => {
    const score = demoSoundtrackScore(spans, 30, 'beeps');
    expect(score.boundaries).toEqual(expected);
    expect(score.boundaries[0]).toBe(DEMO_INTRO_SECONDS);
    const long = score.beeps.filter((b) => b.seconds > 0.4).map((b) => b.atSeconds);
    expect(long).toEqual(expected);
    expect(score.beeps.filter((b) => b.seconds <= 0.4)).toHaveLength(3 * expected.length);
    expect(score.durationSeconds).toBeCloseTo(mediaSeconds, 6);
    // The coach welcomes, names the next exercise in the rests, and says goodbye in the outro.
    const coach = score.lines.filter((l) => l.voice === 'coach').map((l) => l.text);
    expect(coach[0]).toMatch(/^welcome/);
    expect(coach).toContain('next up, Air squat');
    expect(coach.at(-1)).toMatch(/^well done/);
  });

  it('counts down out loud instead, with no beeps, and is the same every time', () => {
    const score = demoSoundtrackScore(spans, 30, 'count');
    expect(score.beeps).toEqual([]);
    const words = score.lines.filter((l) => ['three', 'two', 'one'].includes(l.text));
    expect(words).toHaveLength(3 * expected.length);
    expect(score.countdownStarts).toHaveLength(expected.length);
    expect(demoSoundtrackScore(spans, 30, 'count')).toEqual(score);
  });
});
