import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { expandPlan } from '~/lib/plan/expand-plan';
import type { PlanInput } from '~/lib/plan/plan-schema';
import type { Timeline } from '~/lib/timeline/timeline-schema';
import { applyAllFixes } from '~/lib/timing/apply-fix';
import { checkTiming } from '~/lib/timing/timing-check';
import { findingKey, runFixRounds, withMovedBoundaries } from './fix-rounds';
import { codes, plan, timelineFromPlan } from './timing-fixtures';

const secs = (min: number, max: number) => fc.integer({ min, max });
const exercise = fc.constantFrom('Squat', 'Row', 'Lunge', 'Press', 'Plank');

const classicBlockArb = fc.oneof(
  fc.record({ kind: fc.constantFrom('warmup' as const, 'cooldown' as const, 'talk' as const), seconds: secs(20, 400) }),
  fc
    .record({
      kind: fc.constant('circuit' as const),
      rounds: fc.integer({ min: 1, max: 3 }),
      roundBreakSeconds: secs(0, 90),
      // Some stations are done per side, with or without a switch pause.
      stations: fc.array(
        fc.oneof(
          fc.record({ exercise, workSeconds: secs(10, 90), restSeconds: secs(0, 40) }),
          fc.record({ exercise, workSeconds: secs(10, 90), restSeconds: secs(0, 40), perSide: fc.constant(true), switchSeconds: secs(0, 15) }),
        ),
        { minLength: 1, maxLength: 4 },
      ),
    })
    // Ladders, pyramids and stations left out: any round may get its own seconds or skip
    // stations (never all of them).
    .chain((c) =>
      fc
        .array(
          fc.record(
            {
              round: fc.integer({ min: 1, max: c.rounds }),
              workSeconds: secs(10, 90),
              restSeconds: secs(0, 40),
              skipStations: fc.subarray(
                c.stations.map((_, i) => i + 1),
                { maxLength: c.stations.length - 1 },
              ),
            },
            { requiredKeys: ['round'] },
          ),
          { maxLength: c.rounds },
        )
        .map((changes) => {
          const once = changes.filter((ch, i) => changes.findIndex((x) => x.round === ch.round) === i);
          return once.length > 0 ? { ...c, roundChanges: once } : c;
        }),
    ),
  fc.record({ kind: fc.constant('intervals' as const), exercise, sets: fc.integer({ min: 1, max: 5 }), workSeconds: secs(10, 60), restSeconds: secs(0, 30) }),
  // Intervals done per side: left, switch pause, right in every set.
  fc.record({
    kind: fc.constant('intervals' as const),
    exercise,
    sets: fc.integer({ min: 1, max: 5 }),
    workSeconds: secs(10, 60),
    restSeconds: secs(0, 30),
    perSide: fc.constant(true),
    switchSeconds: secs(0, 15),
  }),
);

// The formats added later: AMRAP and EMOM blocks (per-side stations are in the circuits above).
const blockArb = fc.oneof(
  classicBlockArb,
  fc.record({ kind: fc.constant('amrap' as const), seconds: secs(60, 1200), exercises: fc.array(exercise, { minLength: 1, maxLength: 4 }) }),
  // At least 3 minutes, so that one moved minute never moves the block's median start (see emom-minutes.ts).
  fc.record({ kind: fc.constant('emom' as const), minutes: fc.integer({ min: 3, max: 8 }), workSeconds: secs(10, 50), exercises: fc.array(exercise, { minLength: 1, maxLength: 3 }) }),
);

const planOf = (blocks: typeof blockArb) =>
  fc
    .record({
      blocks: fc.array(blocks, { minLength: 1, maxLength: 4 }),
      options: fc.record({ roundBreakReplacesLastRest: fc.boolean(), dropFinalRest: fc.boolean() }),
    })
    .map((p) => plan(p as PlanInput));
const planArb = planOf(blockArb);
/**
 * The first convergence property (below, "to no errors") is asserted for circuits without
 * per-side stations, intervals without sides and single blocks, where every error has a fix.
 * The second covers every format (per-side stations and intervals, AMRAP, EMOM), where some
 * findings rightly have no fix (two EMOM blocks whose marks disagree on where the second one
 * starts): there the property is that fixing settles, not that nothing is left.
 */
const convergencePlanArb = planOf(
  classicBlockArb.filter((b) => (b.kind !== 'circuit' || b.stations.every((st) => !('perSide' in st))) && !(b.kind === 'intervals' && 'perSide' in b)),
);

/** Known defects: up to 6 shared boundaries moved by up to 90 % of the mark they eat into. */
const movesArb = fc.array(fc.record({ pick: fc.nat(), fraction: fc.integer({ min: -900, max: 900 }).map((n) => n / 1000) }), { minLength: 1, maxLength: 6 });

const tolerancesOf = (p: ReturnType<typeof plan>, kind: string): [number, string, string] => {
  if (kind === 'work') return [p.tolerances.workSeconds, 'work-too-long', 'work-too-short'];
  if (kind === 'rest' || kind === 'round-break') return [p.tolerances.restSeconds, 'rest-too-long', 'rest-too-short'];
  return [p.tolerances.blockSeconds, 'block-length', 'block-length'];
};

describe('timing check properties (fast-check)', () => {
  it('a timeline marking any valid plan exactly has no finding at all', () => {
    fc.assert(
      fc.property(planArb, secs(0, 600), (p, start) => {
        const t = timelineFromPlan(p, start);
        const end = start + expandPlan(p).totals.classSeconds;
        const r = checkTiming(p, t, { mediaSeconds: end });
        expect(r.findings).toEqual([]);
        expect(r.ok).toBe(true);
      }),
      { numRuns: 300 },
    );
  });

  it('moving one shared boundary yields exactly the findings its two lengths call for', () => {
    let withFindings = 0;
    fc.assert(
      fc.property(planArb, fc.nat(), fc.integer({ min: 1, max: 60_000 }), fc.boolean(), (p, pick, magnitudeMs, later) => {
        const t = timelineFromPlan(p);
        fc.pre(t.segments.length >= 2);
        const i = pick % (t.segments.length - 1);
        const left = t.segments[i]!;
        const right = t.segments[i + 1]!;
        const room = later ? right.endSeconds - right.startSeconds : left.endSeconds - left.startSeconds;
        const d = ((later ? 1 : -1) * Math.min(magnitudeMs, Math.round(room * 1000) - 1)) / 1000;
        fc.pre(d !== 0);
        const at = Math.round((left.endSeconds + d) * 1000) / 1000;
        const moved: Timeline = {
          cues: [],
          segments: t.segments.map((s, k) => (k === i ? { ...s, endSeconds: at } : k === i + 1 ? { ...s, startSeconds: at } : s)),
        };
        // Oracle, independent of the check: each of the two segments changed length by ±d;
        // EMOM marks have no length of their own, but a minute's work must start on the minute
        // (work tolerance) and the block must end with its last minute (rest tolerance).
        const expected: string[] = [];
        const diffMs = Math.round(d * 1000);
        for (const [seg, change] of [[left, diffMs], [right, -diffMs]] as const) {
          if (seg.format === 'emom') continue;
          const [tol, long, short] = tolerancesOf(p, seg.kind);
          if (Math.abs(change) > tol * 1000) expected.push(change > 0 ? long : short);
        }
        const schedule = expandPlan(p).segments;
        const [pl, pr] = [schedule[i]!, schedule[i + 1]!];
        if (pr.blockKind === 'emom' && pr.kind === 'work' && Math.abs(diffMs) > p.tolerances.workSeconds * 1000) expected.push('emom-minute');
        if (pl.blockKind === 'emom' && pr.blockIndex !== pl.blockIndex && Math.abs(diffMs) > p.tolerances.restSeconds * 1000) expected.push('emom-minute');
        expect(codes(checkTiming(p, moved).findings)).toEqual(expected.sort());
        if (expected.length > 0) withFindings++;
      }),
      { numRuns: 400 },
    );
    // Guard against a vacuous run: most moves go beyond a tolerance.
    expect(withFindings).toBeGreaterThan(100);
  });

  it('applying every suggested fix converges to no errors after random boundary moves', () => {
    let startedWithErrors = 0;
    let startedWithFindings = 0;
    fc.assert(
      fc.property(
        convergencePlanArb,
        movesArb,
        (p, moves) => {
          const exact = timelineFromPlan(p);
          fc.pre(exact.segments.length >= 2);
          const t = withMovedBoundaries(exact, moves);
          const end = expandPlan(p).totals.classSeconds;
          const before = checkTiming(p, t, { mediaSeconds: end });
          if (!before.ok) startedWithErrors++;
          if (before.findings.length > 0) startedWithFindings++;
          const r = applyAllFixes(p, t, { mediaSeconds: end });
          const after = checkTiming(p, r.timeline, { mediaSeconds: end });
          expect(after.findings.filter((f) => f.severity === 'error')).toEqual([]);
          expect(r.converged).toBe(true);
        },
      ),
      { numRuns: 500 },
    );
    // Guard against a vacuous run (most moves land on rests and blocks, whose findings are warnings).
    expect(startedWithFindings).toBeGreaterThan(150);
    expect(startedWithErrors).toBeGreaterThan(10);
  });

  // Generated inputs with known truth (invented): the exact marking of a random plan is the truth,
  // and the defects are known boundary moves on it, each shortening one mark and lengthening its
  // neighbour. "Apply all fixes" is then pressed until nothing is left to apply.
  it('fixing every format settles: no finding comes back, the count never grows, nothing fixable is left', () => {
    const MAX_ROUNDS = 12;
    let startedWithFindings = 0;
    let endedClean = 0;
    let longest = 0;
    fc.assert(
      fc.property(
        planArb,
        movesArb,
        (p, moves) => {
          const t = withMovedBoundaries(timelineFromPlan(p), moves);
          const context = { mediaSeconds: expandPlan(p).totals.classSeconds };
          const run = runFixRounds(p, t, context, MAX_ROUNDS);
          if (run.counts[0]! > 0) startedWithFindings++;
          if (run.final.length === 0) endedClean++;
          longest = Math.max(longest, run.counts.length - 1);
          expect(run.reappeared).toEqual([]);
          for (let k = 1; k < run.counts.length; k++) expect(run.counts[k]!).toBeLessThanOrEqual(run.counts[k - 1]!);
          expect(run.settled).toBe(true);
          expect(run.final.filter((f) => f.fix).map(findingKey)).toEqual([]);
        },
      ),
      { numRuns: 600 },
    );
    // Guard against a vacuous run: most defects are findings, and most of them are fixed away.
    expect(startedWithFindings).toBeGreaterThan(300);
    expect(endedClean).toBeGreaterThan(startedWithFindings / 2);
    expect(longest).toBeLessThan(MAX_ROUNDS);
  });
});
