/**
 * Test helpers for fix convergence: known defects laid on an exactly marked timeline, and the
 * check-and-fix rounds an editor goes through with "Apply all fixes".
 */
import type { Plan } from '~/lib/plan/plan-schema';
import type { Timeline } from '~/lib/timeline/timeline-schema';
import { applyNonConflictingFixes } from '~/lib/timing/apply-fix';
import type { CheckContext, Finding } from '~/lib/timing/finding-types';
import { checkTiming } from '~/lib/timing/timing-check';

/** One known defect: the boundary after segment `pick` (mod count) moved by `fraction` of the neighbour it eats into. */
export interface BoundaryMove {
  pick: number;
  fraction: number;
}

/**
 * Moves shared boundaries of `t` (an exact marking of its plan, so the truth is known): each
 * move shortens one segment and lengthens its neighbour by the same amount, whole milliseconds.
 */
export function withMovedBoundaries(t: Timeline, moves: readonly BoundaryMove[]): Timeline {
  let out = t;
  for (const { pick, fraction } of moves) {
    if (out.segments.length < 2) return out;
    const i = pick % (out.segments.length - 1);
    const left = out.segments[i]!;
    const right = out.segments[i + 1]!;
    const room = fraction > 0 ? right.endSeconds - right.startSeconds : left.endSeconds - left.startSeconds;
    const at = Math.round((left.endSeconds + fraction * room) * 1000) / 1000;
    if (!(at > left.startSeconds && at < right.endSeconds)) continue;
    out = { cues: [], segments: out.segments.map((s, k) => (k === i ? { ...s, endSeconds: at } : k === i + 1 ? { ...s, startSeconds: at } : s)) };
  }
  return out;
}

/** A finding's identity across rounds: what it is about, not its numbers. */
export const findingKey = (f: Finding): string => `${f.code}|${f.segmentIds.join(',')}|${f.cueIds?.join(',') ?? ''}`;

export interface FixRounds {
  /** Number of findings before the first round and after each round. */
  counts: number[];
  /** Findings that had gone and came back (by `findingKey`). */
  reappeared: string[];
  /** Findings left when no fix was left to apply (or the rounds ran out). */
  final: Finding[];
  /** True when a round found no fix to apply within `maxRounds`. */
  settled: boolean;
}

/**
 * Checks, applies every fix the check offers that does not touch a segment another fix of the
 * round touches (what "Apply all fixes" does), and checks again, for at most `maxRounds` rounds.
 */
export function runFixRounds(plan: Plan, timeline: Timeline, context: CheckContext, maxRounds: number): FixRounds {
  let t = timeline;
  let findings = checkTiming(plan, t, context).findings;
  const counts = [findings.length];
  const gone = new Set<string>();
  const reappeared: string[] = [];
  for (let round = 1; round <= maxRounds; round++) {
    const { timeline: next, applied } = applyNonConflictingFixes(t, findings);
    if (applied.length === 0) return { counts, reappeared, final: findings, settled: true };
    t = next;
    const after = checkTiming(plan, t, context).findings;
    const keys = new Set(after.map(findingKey));
    for (const f of findings) if (!keys.has(findingKey(f))) gone.add(findingKey(f));
    for (const f of after) if (gone.has(findingKey(f))) reappeared.push(findingKey(f));
    counts.push(after.length);
    findings = after;
  }
  const settled = !findings.some((f) => f.fix);
  return { counts, reappeared, final: findings, settled };
}
