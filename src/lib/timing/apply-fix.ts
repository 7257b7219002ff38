/**
 * Applying suggested fixes. A fix only sets segment starts and ends, so applying one
 * returns a new timeline (the input is never changed).
 */
import type { Plan } from '../plan/plan-schema';
import type { Segment, Timeline } from '../timeline/timeline-schema';
import { roundToMillis } from '../time/format-time';
import type { CheckContext, Finding, FixChange } from './finding-types';
import { checkTiming } from './timing-check';

/** The changes of a fix as a list. */
export function fixChanges(fix: Finding['fix']): FixChange[] {
  if (!fix) return [];
  return Array.isArray(fix) ? fix : [fix];
}

/**
 * Returns a new timeline with the changes applied. Throws when a change names a segment
 * that does not exist or would leave a segment that does not end after it starts, since
 * either means the fix does not belong to this timeline.
 */
export function applyChanges(timeline: Timeline, changes: readonly FixChange[]): Timeline {
  const byId = new Map<string, FixChange[]>();
  for (const c of changes) {
    const list = byId.get(c.segmentId);
    if (list) list.push(c); else byId.set(c.segmentId, [c]);
  }
  const seen = new Set<string>();
  const segments = timeline.segments.map((s): Segment => {
    const list = byId.get(s.id);
    if (!list) return s;
    seen.add(s.id);
    const next = { ...s };
    for (const c of list) next[c.field] = roundToMillis(c.value);
    if (!(next.endSeconds > next.startSeconds) || next.startSeconds < 0) {
      throw new Error(`The fix would leave segment "${s.id}" without length; check the timeline again.`);
    }
    return next;
  });
  for (const id of byId.keys()) {
    if (!seen.has(id)) throw new Error(`The fix names segment "${id}", which is not in this timeline.`);
  }
  return { segments, cues: timeline.cues };
}

/** Applies one finding's suggested fix (a finding without a fix returns the same timeline). */
export function applyFix(timeline: Timeline, finding: Finding): Timeline {
  const changes = fixChanges(finding.fix);
  return changes.length === 0 ? timeline : applyChanges(timeline, changes);
}

/**
 * Applies the fixes of `findings` that do not conflict: a finding's fix is skipped when it
 * touches a segment an earlier applied fix already touched (errors go first). Returns the
 * new timeline and the findings whose fixes were applied.
 */
export function applyNonConflictingFixes(timeline: Timeline, findings: readonly Finding[]): { timeline: Timeline; applied: Finding[] } {
  const rank = { error: 0, warning: 1, info: 2 } as const;
  const ordered = findings.filter((f) => f.fix).sort((a, b) => rank[a.severity] - rank[b.severity]);
  const touched = new Set<string>();
  const changes: FixChange[] = [];
  const applied: Finding[] = [];
  for (const f of ordered) {
    const list = fixChanges(f.fix);
    if (list.some((c) => touched.has(c.segmentId))) continue;
    for (const c of list) touched.add(c.segmentId);
    changes.push(...list);
    applied.push(f);
  }
  return { timeline: changes.length > 0 ? applyChanges(timeline, changes) : timeline, applied };
}

export interface ApplyAllResult {
  timeline: Timeline;
  /** Number of check-and-fix passes run. */
  passes: number;
  /** Number of fixes applied over all passes. */
  appliedCount: number;
  /** Whether a pass ended with no fix left to apply (rather than hitting `maxPasses`). */
  converged: boolean;
}

/**
 * Checks, applies every non-conflicting suggested fix, and repeats until the check suggests
 * no more fixes or `maxPasses` is reached. Each pass is a full check, so fixes always see
 * the current timeline.
 */
export function applyAllFixes(plan: Plan, timeline: Timeline, context: CheckContext = {}, maxPasses = 20): ApplyAllResult {
  let current = timeline;
  let appliedCount = 0;
  for (let pass = 1; pass <= maxPasses; pass++) {
    const { findings } = checkTiming(plan, current, context);
    const { timeline: next, applied } = applyNonConflictingFixes(current, findings);
    if (applied.length === 0) return { timeline: current, passes: pass, appliedCount, converged: true };
    appliedCount += applied.length;
    current = next;
  }
  return { timeline: current, passes: maxPasses, appliedCount, converged: false };
}
