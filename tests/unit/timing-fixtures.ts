/** Test helpers: plans written by hand and timelines built from a schedule. */
import { evenStations } from '~/lib/plan/even-stations';
import { expandPlan } from '~/lib/plan/expand-plan';
import { planSchema, type Plan, type PlanInput } from '~/lib/plan/plan-schema';
import type { Segment, Timeline } from '~/lib/timeline/timeline-schema';

export const plan = (input: PlanInput): Plan => planSchema.parse(input);

/** A timeline marking exactly the expected schedule from `start`, ids `s0`, `s1`, … */
export function timelineFromPlan(p: Plan, start = 0): Timeline {
  const segments: Segment[] = expandPlan(p, start).segments.map((s, i) => ({
    id: `s${i}`,
    kind: s.kind,
    startSeconds: s.startSeconds,
    endSeconds: s.startSeconds + s.seconds,
    ...(s.kind === 'work' ? { exercise: s.exercise } : {}),
    ...(s.round !== undefined ? { round: s.round } : {}),
    ...(s.set !== undefined ? { set: s.set } : {}),
    ...(s.side !== undefined ? { side: s.side } : {}),
    ...(s.format !== undefined ? { format: s.format } : {}),
  }));
  return { segments, cues: [] };
}

/** Replaces segments matching `pick` with `change(segment)`. */
export function edit(t: Timeline, id: string, change: Partial<Segment>): Timeline {
  return { ...t, segments: t.segments.map((s) => (s.id === id ? { ...s, ...change } : s)) };
}

export function without(t: Timeline, ...ids: string[]): Timeline {
  return { ...t, segments: t.segments.filter((s) => !ids.includes(s.id)) };
}

export const codes = (findings: readonly { code: string }[]): string[] => findings.map((f) => f.code).sort();

/**
 * A small circuit used across the check tests (invented, not a check value):
 * warm-up 60 s; 3 stations (A, B, C) × 40 s work / 20 s rest × 2 rounds, 30 s round break;
 * cool-down 60 s. Default options (round break replaces last rest, final rest dropped).
 * Schedule by hand: warm-up 0–60; round 1: A 60–100, rest 100–120, B 120–160, rest 160–180,
 * C 180–220, break 220–250; round 2: A 250–290, rest 290–310, B 310–350, rest 350–370,
 * C 370–410; cool-down 410–470.
 */
export const smallCircuit = (): Plan =>
  plan({
    blocks: [
      { kind: 'warmup', seconds: 60 },
      {
        kind: 'circuit',
        rounds: 2,
        roundBreakSeconds: 30,
        stations: evenStations(['A', 'B', 'C'], 40, 20),
      },
      { kind: 'cooldown', seconds: 60 },
    ],
  });
