/**
 * A read-only view of a timeline prepared once per check: segments sorted by time, their
 * positions, the running maximum end (for overlap/gap sweeps and safe fixes) and what the
 * plan expects of each marked segment.
 */
import type { PlannedSegment } from '../plan/expand-plan';
import type { Tolerances } from '../plan/plan-schema';
import type { Segment } from '../timeline/timeline-schema';

/** What the plan expects of one marked segment. */
export interface Expectation {
  planned: PlannedSegment;
  /** Planned length in seconds. */
  seconds: number;
  /** Allowed difference in seconds. */
  tolerance: number;
  /** The start is a point in time of its own (an EMOM minute's top): other fixes leave it alone. */
  pinnedStart?: boolean;
}

export interface TimelineView {
  /** Segments ordered by start, then end, then id. */
  segments: Segment[];
  /** Segment id -> position in `segments`. */
  position: Map<string, number>;
  /** maxEndBefore[i]: the largest end among segments[0..i-1] (-Infinity for i = 0). */
  maxEndBefore: Float64Array;
  /** holderBefore[i]: position of the segment holding maxEndBefore[i] (-1 for i = 0). */
  holderBefore: Int32Array;
  /** Filled by plan matching: segment id -> expectation. */
  expected: Map<string, Expectation>;
  tolerances: Tolerances;
  /** Media length (Infinity when unknown): fixes never move an end past it. */
  mediaSeconds: number;
}

/** Orders segments by start, then end, then id, so every run sees the same order. */
export function compareSegments(a: Segment, b: Segment): number {
  return a.startSeconds - b.startSeconds || a.endSeconds - b.endSeconds || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);
}

/** Builds the view (the sort is the only super-linear step). */
export function buildTimelineView(segments: readonly Segment[], tolerances: Tolerances, mediaSeconds: number | null | undefined): TimelineView {
  const sorted = [...segments].sort(compareSegments);
  const n = sorted.length;
  const position = new Map<string, number>();
  const maxEndBefore = new Float64Array(n + 1);
  const holderBefore = new Int32Array(n + 1);
  let maxEnd = -Infinity;
  let holder = -1;
  for (let i = 0; i < n; i++) {
    const s = sorted[i]!;
    position.set(s.id, i);
    maxEndBefore[i] = maxEnd;
    holderBefore[i] = holder;
    if (s.endSeconds > maxEnd) {
      maxEnd = s.endSeconds;
      holder = i;
    }
  }
  maxEndBefore[n] = maxEnd;
  holderBefore[n] = holder;
  return {
    segments: sorted,
    position,
    maxEndBefore,
    holderBefore,
    expected: new Map(),
    tolerances,
    mediaSeconds: mediaSeconds ?? Infinity,
  };
}
