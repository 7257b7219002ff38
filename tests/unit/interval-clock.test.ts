import { describe, expect, it } from 'vitest';
import { clockAt, clockHeading, clockTimeline } from '~/lib/publishing/interval-clock';
import { expandPlan } from '~/lib/plan/expand-plan';
import { planSchema } from '~/lib/plan/plan-schema';
import type { Segment } from '~/lib/timeline/timeline-schema';

// A common strength circuit: 6 stations × (45 s work + 15 s rest) × 3 rounds (common practice, no source).
const plan = planSchema.parse({
  blocks: [
    {
      kind: 'circuit', rounds: 3, roundBreakSeconds: 0,
      stations: ['A', 'B', 'C', 'D', 'E', 'F'].map((n) => ({ exercise: `Move ${n}`, workSeconds: 45, restSeconds: 15 })),
    },
  ],
  options: { roundBreakReplacesLastRest: false, dropFinalRest: false },
});
const segments: Segment[] = expandPlan(plan).segments.map((p) => ({
  id: `s${p.index}`, kind: p.kind, startSeconds: p.startSeconds, endSeconds: p.startSeconds + p.seconds,
  ...(p.exercise ? { exercise: p.exercise } : {}), ...(p.round ? { round: p.round } : {}),
}));
const clock = clockTimeline(segments);

describe('interval clock', () => {
  it('shows the move, time left, round and what is next', () => {
    // Round 2 starts at 6 × 60 s = 360 s; Move B of round 2 works 420–465 s.
    const at = clockAt(clock, 430);
    expect(at.current).toEqual({ kind: 'work', label: 'Move B', exercise: 'Move B' });
    expect(at.remaining).toBe(35);
    expect(at.length).toBe(45);
    expect([at.round, at.rounds]).toEqual([2, 3]);
    expect(at.next).toEqual({ label: 'Rest', inSeconds: 35 });
  });

  it('keeps the round during a rest and counts down to the next move', () => {
    const at = clockAt(clock, 470);
    expect(at.current?.label).toBe('Rest');
    expect(at.round).toBe(2);
    expect(at.next).toEqual({ label: 'Move C', inSeconds: 10 });
  });

  it('ends after the last part (18 min = 1080 s)', () => {
    const end = clockAt(clock, 1080);
    expect(end.current).toBeNull();
    expect(end.next).toBeNull();
  });
});

describe('the line above the part’s name on the clock', () => {
  it.each([
    [{ kind: 'work', label: 'Goblet squat', exercise: 'Goblet squat' }, 'Work'],
    [{ kind: 'intro', label: 'Welcome' }, null], // once "WELCOME / Welcome"
    [{ kind: 'rest', label: 'Rest' }, null],
    [{ kind: 'work', label: 'Work' }, null],
    [null, 'Get ready'],
  ] as const)('%o → %s', (current, heading) => {
    expect(clockHeading({ current: current as never, format: null })).toBe(heading);
  });
});
