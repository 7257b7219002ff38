/**
 * Snapping for the timeline editor: a boundary the coach drags or drops lands on the nearest
 * audio onset (a tone, a clap, a loud count-in), planned boundary or neighbouring mark, when
 * one is close enough. Pure; the distance is given in seconds (the editor converts pixels).
 */
import { expandPlan } from '../plan/expand-plan';
import type { Plan } from '../plan/plan-schema';
import type { Segment, Timeline } from '../timeline/timeline-schema';

export type SnapSource = 'onset' | 'plan' | 'mark';

export interface SnapTargets {
  /** Audio onsets in seconds, ascending (from `findOnsets`). */
  onsets: readonly number[];
  /** Planned boundaries in seconds, ascending. */
  planned: readonly number[];
  /** Other marks' boundaries in seconds (any order). */
  marks?: readonly number[];
}

export interface SnapOptions {
  /** Snapping switched on in the editor. */
  enabled: boolean;
  /** The bypass modifier is held: place exactly where the pointer is. */
  bypass?: boolean;
  /** How far a target may be, in seconds. */
  maxDistance: number;
}

export interface Snapped {
  time: number;
  source: SnapSource | null;
}

/** Nearest value of an ascending list to `t` (binary search), or undefined for an empty list. */
export function nearestSorted(list: readonly number[], t: number): number | undefined {
  if (list.length === 0) return undefined;
  let lo = 0;
  let hi = list.length - 1;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if ((list[mid] as number) < t) lo = mid + 1;
    else hi = mid;
  }
  const after = list[lo] as number;
  const before = lo > 0 ? (list[lo - 1] as number) : undefined;
  return before !== undefined && t - before <= after - t ? before : after;
}

/**
 * Snaps `time` to the closest target within `maxDistance`. On a tie an onset wins over the
 * plan and the plan over another mark: the recording is the truth, the plan the intention.
 */
export function snapTime(time: number, targets: SnapTargets, options: SnapOptions): Snapped {
  if (!options.enabled || options.bypass) return { time, source: null };
  const candidates: [number | undefined, SnapSource][] = [
    [nearestSorted(targets.onsets, time), 'onset'],
    [nearestSorted(targets.planned, time), 'plan'],
    [nearestAny(targets.marks ?? [], time), 'mark'],
  ];
  let best: Snapped = { time, source: null };
  let bestDistance = Infinity;
  for (const [value, source] of candidates) {
    if (value === undefined) continue;
    const d = Math.abs(value - time);
    if (d <= options.maxDistance && d < bestDistance - 1e-9) {
      best = { time: value, source };
      bestDistance = d;
    }
  }
  return best;
}

function nearestAny(list: readonly number[], t: number): number | undefined {
  let best: number | undefined;
  for (const v of list) if (best === undefined || Math.abs(v - t) < Math.abs(best - t)) best = v;
  return best;
}

/**
 * Where the plan starts on this recording: the start of the first marked segment of the
 * plan's first kind (a warm-up, usually), else the first marked segment, else 0.
 */
export function planAnchor(plan: Plan, timeline: Timeline): number {
  const first = expandPlan(plan, 0).segments[0];
  const sorted = [...timeline.segments].sort((a, b) => a.startSeconds - b.startSeconds);
  const match = first ? sorted.find((s) => s.kind === first.kind) : undefined;
  return match?.startSeconds ?? sorted[0]?.startSeconds ?? 0;
}

/** Every planned boundary (starts and the last end) with the plan laid out from `anchor`, ascending. */
export function plannedBoundaries(plan: Plan, anchor: number): number[] {
  const schedule = expandPlan(plan, anchor);
  const out: number[] = [];
  for (const p of schedule.segments) out.push(p.startSeconds);
  const last = schedule.segments[schedule.segments.length - 1];
  if (last) out.push(last.startSeconds + last.seconds);
  return out;
}

/**
 * The planned length of the part a segment stands for (same kind, exercise and round or set),
 * or undefined when the plan has no such part. Lets a dragged edge snap to "planned length".
 */
export function plannedLengthOf(plan: Plan, segment: Segment): number | undefined {
  const schedule = expandPlan(plan, 0).segments;
  const exact = schedule.find(
    (p) =>
      p.kind === segment.kind &&
      (segment.exercise === undefined || p.exercise === segment.exercise) &&
      (segment.round === undefined || p.round === segment.round) &&
      (segment.set === undefined || p.set === segment.set),
  );
  return (exact ?? schedule.find((p) => p.kind === segment.kind))?.seconds;
}

/**
 * Targets for one edge: onsets, the plan's boundaries, the edge that would give the segment its
 * planned length, and the other segments' boundaries (excluding this segment's own edges).
 */
export function edgeTargets(
  plan: Plan | null,
  timeline: Timeline,
  segmentId: string,
  side: 'start' | 'end',
  onsets: readonly number[],
  planned: readonly number[],
): SnapTargets {
  const segment = timeline.segments.find((s) => s.id === segmentId);
  const marks: number[] = [];
  for (const s of timeline.segments) {
    if (s.id === segmentId) continue;
    marks.push(s.startSeconds, s.endSeconds);
  }
  let plannedWithLength: number[] = [...planned];
  if (plan && segment) {
    const length = plannedLengthOf(plan, segment);
    if (length !== undefined) {
      const t = side === 'end' ? segment.startSeconds + length : segment.endSeconds - length;
      plannedWithLength = insertSorted(plannedWithLength, t);
    }
  }
  return { onsets, planned: plannedWithLength, marks };
}

function insertSorted(list: number[], t: number): number[] {
  const i = list.findIndex((v) => v > t);
  if (i === -1) return [...list, t];
  return [...list.slice(0, i), t, ...list.slice(i)];
}
