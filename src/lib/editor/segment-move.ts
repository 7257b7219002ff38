/**
 * Moving a whole segment (both edges together, its length kept), by a pointer drag or by keys.
 * It behaves like an edge drag (`moveEdge`): a neighbour that shares a boundary with the segment
 * follows that boundary and keeps at least MIN_SEGMENT_SECONDS; any other segment is a wall the
 * moved segment stops at, so a move never makes a new overlap; the recording's ends clamp it.
 * Pure; times are rounded to milliseconds like every stored time.
 */
import type { Segment, Timeline } from '../timeline/timeline-schema';
import { roundToMillis } from '../time/format-time';
import { MIN_SEGMENT_SECONDS, SAME_TIME } from './edit-limits';
import { snapTime, type SnapOptions, type SnapTargets } from './snapping';

/** How far the segment's start may go: the lowest and highest start, with the neighbours that follow it. */
export interface MoveRoom {
  lo: number;
  hi: number;
  /** Segments ending where this one starts (their end follows the start). */
  before: Segment[];
  /** Segments starting where this one ends (their start follows the end). */
  after: Segment[];
}

export function moveRoom(t: Timeline, seg: Segment, mediaSeconds = Infinity): MoveRoom {
  const length = seg.endSeconds - seg.startSeconds;
  const before: Segment[] = [];
  const after: Segment[] = [];
  let lo = 0;
  let hi = mediaSeconds - length;
  for (const o of t.segments) {
    if (o.id === seg.id) continue;
    if (Math.abs(o.endSeconds - seg.startSeconds) < SAME_TIME) {
      before.push(o);
      lo = Math.max(lo, o.startSeconds + MIN_SEGMENT_SECONDS);
    } else if (Math.abs(o.startSeconds - seg.endSeconds) < SAME_TIME) {
      after.push(o);
      hi = Math.min(hi, o.endSeconds - MIN_SEGMENT_SECONDS - length);
    } else if (o.endSeconds <= seg.startSeconds) {
      lo = Math.max(lo, o.endSeconds); // a segment wholly before: the move stops at its end
    } else if (o.startSeconds >= seg.endSeconds) {
      hi = Math.min(hi, o.startSeconds - length); // one wholly after: the move stops at its start
    }
    // A segment that already overlaps this one (an imported overlap) is left as it is: the move
    // neither clears nor blocks it; the timing check keeps reporting it.
  }
  return { lo, hi, before, after };
}

export type MoveResult =
  | { ok: true; timeline: Timeline; startSeconds: number; clamped: boolean }
  | { ok: false; message: string };

/**
 * Moves the segment so it starts at `to` (clamped to the room it has). Refuses, with a message,
 * when it cannot move at all in that direction.
 */
export function moveSegment(t: Timeline, segmentId: string, to: number, mediaSeconds = Infinity): MoveResult {
  const seg = t.segments.find((s) => s.id === segmentId);
  if (!seg) return { ok: false, message: 'Select a segment first, then move it.' };
  const room = moveRoom(t, seg, mediaSeconds);
  const wanted = roundToMillis(to);
  const start = roundToMillis(Math.min(room.hi, Math.max(room.lo, wanted)));
  if (room.lo > room.hi + SAME_TIME || Math.abs(start - seg.startSeconds) < SAME_TIME) {
    if (Math.abs(wanted - seg.startSeconds) < SAME_TIME) return { ok: false, message: 'The segment is already there.' };
    return {
      ok: false,
      message: wanted < seg.startSeconds
        ? 'There is no room to move this segment earlier: another segment or the start of the recording is in the way.'
        : 'There is no room to move this segment later: another segment or the end of the recording is in the way.',
    };
  }
  const end = roundToMillis(start + (seg.endSeconds - seg.startSeconds));
  const before = new Set(room.before.map((s) => s.id));
  const after = new Set(room.after.map((s) => s.id));
  const segments = t.segments.map((s) => {
    if (s.id === seg.id) return { ...s, startSeconds: start, endSeconds: end };
    if (before.has(s.id)) return { ...s, endSeconds: start };
    if (after.has(s.id)) return { ...s, startSeconds: end };
    return s;
  });
  return { ok: true, timeline: { ...t, segments }, startSeconds: start, clamped: Math.abs(start - wanted) >= SAME_TIME };
}

/**
 * Where a dragged segment lands with snapping: its start and its end each look for a target
 * (a sound, the plan, another mark) near where they were dropped; the one that snaps by the
 * smaller distance wins and the other edge follows at the segment's length. Without a target in
 * reach (or with snapping off or bypassed) the segment starts where it was dropped.
 */
export function snapSegmentStart(droppedStart: number, length: number, targets: SnapTargets, options: SnapOptions): number {
  const byStart = snapTime(droppedStart, targets, options);
  const byEnd = snapTime(droppedStart + length, targets, options);
  const startShift = byStart.source ? Math.abs(byStart.time - droppedStart) : Infinity;
  const endShift = byEnd.source ? Math.abs(byEnd.time - (droppedStart + length)) : Infinity;
  if (startShift === Infinity && endShift === Infinity) return droppedStart;
  return startShift <= endShift ? byStart.time : byEnd.time - length;
}

/**
 * Snap targets for moving a whole segment: sounds, the plan's boundaries and the other segments'
 * edges, leaving out the segment's own edges (and the neighbours' edges it shares, which move with it).
 */
export function moveTargets(t: Timeline, segmentId: string, onsets: readonly number[], planned: readonly number[]): SnapTargets {
  const seg = t.segments.find((s) => s.id === segmentId);
  const own = seg ? [seg.startSeconds, seg.endSeconds] : [];
  const marks: number[] = [];
  for (const s of t.segments) {
    if (s.id === segmentId) continue;
    for (const v of [s.startSeconds, s.endSeconds]) if (!own.some((o) => Math.abs(o - v) < SAME_TIME)) marks.push(v);
  }
  return { onsets, planned, marks };
}
