/**
 * The timing check: compares a marked timeline with its plan, the recording and the
 * advertised length. Pure and synchronous, so the editor runs the same check as the server.
 */
import { expandPlan } from '../plan/expand-plan';
import type { Plan } from '../plan/plan-schema';
import type { Timeline } from '../timeline/timeline-schema';
import { checkTotals } from './check-totals';
import { SEVERITY_RANK, type CheckContext, type CheckResult, type Finding } from './finding-types';
import { advertisedFinding, cueFindings, lengthFindings, structureFindings } from './finding-rules';
import { emomFindings } from './emom-minutes';
import { matchPlan } from './match-plan';
import { buildTimelineView } from './timeline-view';

const firstId = (f: Finding): string => f.segmentIds[0] ?? f.cueIds?.[0] ?? '';
const compareText = (a: string, b: string): number => (a < b ? -1 : a > b ? 1 : 0);

/** Stable order: time, then severity (errors first), then code, then the first segment or cue id. */
export function compareFindings(a: Finding, b: Finding): number {
  return (
    a.atSeconds - b.atSeconds ||
    SEVERITY_RANK[a.severity] - SEVERITY_RANK[b.severity] ||
    compareText(a.code, b.code) ||
    compareText(firstId(a), firstId(b))
  );
}

/**
 * Runs the timing check. `plan` and `timeline` must already be valid (parse them with
 * `planSchema` / `timelineContentSchema`); the check itself does not validate, to stay fast.
 * `ok` is true when no finding is an error.
 */
export function checkTiming(plan: Plan, timeline: Timeline, context: CheckContext = {}): CheckResult {
  const schedule = expandPlan(plan, 0);
  const view = buildTimelineView(timeline.segments, plan.tolerances, context.mediaSeconds);
  const match = matchPlan(plan, schedule, view);
  const findings: Finding[] = [
    ...structureFindings(view),
    ...match.findings,
    ...emomFindings(plan, view, match.workPlanned),
    ...lengthFindings(view),
    ...cueFindings(view, timeline.cues),
  ];
  const totals = checkTotals(plan, schedule, view, context.advertisedMinutes);
  const hasSegments = view.segments.length > 0;
  const advertised = advertisedFinding(
    view,
    hasSegments ? totals.marked.classSeconds : schedule.totals.classSeconds,
    !hasSegments,
    context.advertisedMinutes,
  );
  if (advertised) findings.push(advertised);
  findings.sort(compareFindings);
  return { ok: !findings.some((f) => f.severity === 'error'), findings, totals };
}
