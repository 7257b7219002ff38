/**
 * What members repeat in a marked AMRAP span: the exercise list of the plan's AMRAP block the
 * span stands for. The plan keeps the list (one place to edit it); the editor, the chapters and
 * the interval clock read it through here. Which block a span stands for is decided by the same
 * matching as the timing check, so a missing or extra AMRAP mark does not shift the lists.
 */
import { expandPlan } from '../plan/expand-plan';
import type { Plan } from '../plan/plan-schema';
import type { Segment } from '../timeline/timeline-schema';
import { matchPlan } from './match-plan';
import { buildTimelineView } from './timeline-view';

/** Marked AMRAP work segment id -> the exercises of its AMRAP block (segments matching none are left out). */
export function amrapExercisesBySegment(plan: Plan, segments: readonly Segment[]): Map<string, string[]> {
  const out = new Map<string, string[]>();
  if (!segments.some((s) => s.format === 'amrap') || !plan.blocks.some((b) => b.kind === 'amrap')) return out;
  const view = buildTimelineView(segments, plan.tolerances, null);
  const { workPlanned } = matchPlan(plan, expandPlan(plan, 0), view);
  for (const s of segments) {
    if (s.kind !== 'work' || s.format !== 'amrap') continue;
    const planned = workPlanned.get(s.id);
    const block = planned ? plan.blocks[planned.blockIndex] : undefined;
    if (block?.kind === 'amrap') out.set(s.id, [...block.exercises]);
  }
  return out;
}
