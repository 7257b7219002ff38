/**
 * "Mark it for me" proposal on hand-made event lists. All inputs are invented for the tests:
 * the events a timer, a whistle or a spoken count would produce at known boundary times.
 */
import { describe, expect, it } from 'vitest';
import type { AudioEvent } from '~/lib/audio/audio-events';
import { findBoundaryCandidates } from '~/lib/marking/boundary-evidence';
import { plannedBoundaries } from '~/lib/marking/align-plan';
import { proposeTimeline, REVIEW_BELOW } from '~/lib/marking/propose-timeline';
import { seededRandom } from '~/lib/media/class-soundtrack';
import { expandPlan } from '~/lib/plan/expand-plan';
import { checkTiming } from '~/lib/timing/timing-check';
import { timelineContentSchema } from '~/lib/timeline/timeline-schema';
import { ACCURACY_PLAN } from '../helpers/marking-fixtures';

const planned = plannedBoundaries(expandPlan(ACCURACY_PLAN).segments);

/** True boundaries: the plan shifted by `offset`, every part off by up to ±`drift`, round break `longBreak` +8 s. */
function drifted(offset: number, drift: number, seed: number, longBreak = 1): number[] {
  const random = seededRandom(seed);
  const segments = expandPlan(ACCURACY_PLAN).segments;
  const out = [offset];
  let breaks = 0;
  for (const s of segments) {
    let seconds = s.seconds + (random() * 2 - 1) * drift;
    if (s.kind === 'round-break' && breaks++ === longBreak) seconds = s.seconds + 8;
    out.push(out[out.length - 1]! + seconds);
  }
  return out;
}

const tone = (atSeconds: number, durationSeconds: number): AudioEvent => ({ atSeconds, kind: 'tone', strength: 0.8, durationSeconds, frequencyHz: 1000 });
const beeps = (b: number): AudioEvent[] => [tone(b - 3, 0.15), tone(b - 2, 0.15), tone(b - 1, 0.15), tone(b, 0.6)];
const word = (atSeconds: number): AudioEvent => ({ atSeconds, kind: 'speech', strength: 0.6, durationSeconds: 0.3 });

describe('proposal from timer beeps (invented events)', () => {
  const truth = drifted(41.3, 1.5, 3);
  const events = truth.flatMap(beeps);
  const media = truth[truth.length - 1]! + 10;
  const proposal = proposeTimeline(ACCURACY_PLAN, events, media);

  it('places every boundary on its long beep, with high confidence', () => {
    expect(proposal.method).toBe('audio-aligned');
    expect(proposal.boundaries).toHaveLength(truth.length);
    proposal.boundaries.forEach((b, i) => {
      expect(b.atSeconds).toBeCloseTo(truth[i]!, 2);
      expect(b.evidence).toBe('tone');
      expect(b.confidence).toBeGreaterThanOrEqual(REVIEW_BELOW);
    });
  });

  it('answers segments and cues in the timeline shapes, in plan order, each ending where the next starts', () => {
    expect(() => timelineContentSchema.parse({ segments: proposal.segments, cues: proposal.cues })).not.toThrow();
    const schedule = expandPlan(ACCURACY_PLAN).segments;
    proposal.segments.forEach((s, i) => {
      expect(s.kind).toBe(schedule[i]!.kind);
      expect(s.startSeconds).toBe(proposal.boundaries[i]!.atSeconds);
      expect(s.endSeconds).toBe(proposal.boundaries[i + 1]!.atSeconds);
    });
    expect(proposal.segments[1]).toMatchObject({ kind: 'work', exercise: 'Squats', round: 1 });
  });

  it('proposes a countdown cue where the short beeps start', () => {
    expect(proposal.cues).toHaveLength(truth.length);
    proposal.cues.forEach((c, i) => {
      expect(c.kind).toBe('countdown');
      expect(c.atSeconds).toBeCloseTo(truth[i]! - 3, 2);
    });
    expect(proposal.cues[1]!.text).toBe('Countdown into Squats');
  });

  it('passes the timing check with no errors when saved as the timeline', () => {
    const result = checkTiming(ACCURACY_PLAN, { segments: proposal.segments, cues: proposal.cues }, { mediaSeconds: media });
    expect(result.findings.filter((f) => f.severity === 'error')).toEqual([]);
  });
});

describe('missing and misleading evidence (invented events)', () => {
  it('with no events lays the plan out from the start, every boundary marked "plan" and low', () => {
    const proposal = proposeTimeline(ACCURACY_PLAN, [], 900);
    expect(proposal.method).toBe('plan-only');
    expect(proposal.boundaries.map((b) => b.atSeconds)).toEqual(planned);
    expect(proposal.boundaries.every((b) => b.evidence === 'plan' && b.confidence < REVIEW_BELOW)).toBe(true);
    expect(proposal.cues).toEqual([]);
  });

  it('places a boundary without evidence by the plan after the previous one, with low confidence', () => {
    const truth = drifted(12, 1, 5);
    const gap = 9;
    const events = truth.flatMap((b, i) => (i === gap ? [] : beeps(b)));
    const proposal = proposeTimeline(ACCURACY_PLAN, events, truth[truth.length - 1]! + 5);
    const b = proposal.boundaries[gap]!;
    expect(b.evidence).toBe('plan');
    expect(b.confidence).toBeLessThan(REVIEW_BELOW);
    const segments = expandPlan(ACCURACY_PLAN).segments;
    expect(b.atSeconds).toBeCloseTo(proposal.boundaries[gap - 1]!.atSeconds + segments[gap - 1]!.seconds, 2);
    proposal.boundaries.forEach((x, i) => {
      if (i !== gap) expect(x.atSeconds).toBeCloseTo(truth[i]!, 2);
    });
  });

  it('ignores stray beeps in the middle of parts and never reorders', () => {
    const truth = drifted(30, 1.5, 9);
    const strays = truth.slice(0, -1).map((b, i) => tone((b + truth[i + 1]!) / 2, 0.6));
    const proposal = proposeTimeline(ACCURACY_PLAN, [...truth.flatMap(beeps), ...strays], truth[truth.length - 1]! + 5);
    proposal.boundaries.forEach((x, i) => expect(x.atSeconds).toBeCloseTo(truth[i]!, 2));
    for (let i = 1; i < proposal.boundaries.length; i++) {
      expect(proposal.boundaries[i]!.atSeconds).toBeGreaterThan(proposal.boundaries[i - 1]!.atSeconds);
    }
  });

  it('follows a whistle, and a spoken count (its last word), with a countdown cue at the count', () => {
    const truth = drifted(25, 1.5, 11);
    const whistles = truth.map((b): AudioEvent => ({ atSeconds: b, kind: 'whistle', strength: 0.7, durationSeconds: 0.6, frequencyHz: 3000 }));
    const w = proposeTimeline(ACCURACY_PLAN, whistles, truth[truth.length - 1]! + 5);
    w.boundaries.forEach((x, i) => {
      expect(x.atSeconds).toBeCloseTo(truth[i]!, 2);
      expect(x.evidence).toBe('whistle');
    });
    const counts = truth.flatMap((b) => [word(b - 3.05), word(b - 2), word(b - 0.95), word(b)]);
    const c = proposeTimeline(ACCURACY_PLAN, counts, truth[truth.length - 1]! + 5);
    c.boundaries.forEach((x, i) => {
      expect(x.atSeconds).toBeCloseTo(truth[i]!, 2);
      expect(x.evidence).toBe('voice');
    });
    expect(c.cues[3]!.atSeconds).toBeCloseTo(truth[3]! - 3.05, 2);
  });
});

describe('boundary candidates (invented events)', () => {
  it('reads short beeps then a long one as a countdown into the long beep', () => {
    expect(findBoundaryCandidates(beeps(50))).toEqual([{ atSeconds: 50, evidence: 'tone', score: expect.any(Number), countdownStartSeconds: 47 }]);
  });

  it('reads short beeps without a long one as a change one beat after the last', () => {
    const [c] = findBoundaryCandidates([tone(10, 0.15), tone(11, 0.15), tone(12, 0.15)]);
    expect(c).toMatchObject({ atSeconds: 13, evidence: 'tone', countdownStartSeconds: 10 });
  });

  it('does not read words two or more seconds apart as a count', () => {
    expect(findBoundaryCandidates([word(1), word(3), word(5), word(7)])).toEqual([]);
  });
});

describe('review order of uncertain boundaries', () => {
  const b = (atSeconds: number, confidence: number) => ({ atSeconds, confidence, evidence: 'plan' as const });
  const list = [b(10, 0.9), b(20, 0.2), b(30, 0.95), b(40, 0.5)];
  it('goes to the next uncertain boundary after the one under review, then wraps', async () => {
    const { nextUncertainIndex } = await import('~/lib/marking/review');
    expect(nextUncertainIndex(list, -1, 0.6)).toBe(1);
    expect(nextUncertainIndex(list, 20, 0.6)).toBe(3);
    expect(nextUncertainIndex(list, 40, 0.6)).toBe(1);
    expect(nextUncertainIndex([b(10, 0.9)], -1, 0.6)).toBeNull();
  });
});
