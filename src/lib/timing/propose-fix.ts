/**
 * Suggested fixes. Every fix moves segment boundaries only, never past a neighbour, so it
 * cannot create an overlap; where two segments are back to back, the shared boundary moves
 * for both, which is what a mis-placed mark needs. Among the possible moves the one that
 * keeps neighbours within their tolerances (and opens no reportable gap) wins, so that
 * applying fixes repeatedly converges instead of pushing an error back and forth.
 *
 * All arithmetic is in whole milliseconds to avoid float drift at tolerance edges.
 */
import { toMillis } from '../time/format-time';
import type { FixChange } from './finding-types';
import type { TimelineView } from './timeline-view';

const ms = toMillis;
const sec = (millis: number): number => millis / 1000;

interface Candidate {
  changes: FixChange[];
  /** How far (ms) the affected neighbour was beyond its tolerance before the move. */
  excessBefore: number;
  /** 1 when the move opens or widens a gap longer than the gap tolerance. */
  reportableGap: number;
  /** How far (ms) the affected neighbour is beyond its tolerance after the move. */
  excess: number;
  /** 1 when the move leaves any new unmarked time. */
  opensGap: number;
  /** 0 for moving the end, 1 for moving the start (ends are marked later, so less sure). */
  side: number;
}

/**
 * A move that pushes a neighbour (further) beyond its tolerance only trades one finding for
 * another and would make repeated fixing go back and forth: such moves are never offered.
 */
const harmful = (c: Candidate): boolean => c.excess > c.excessBefore;

/**
 * An EMOM minute's work starts at the top of the minute, a point in time rather than a length,
 * so a fix for a neighbour's length never moves it (the EMOM rule would move it back, and the
 * two fixes would take turns).
 */
const movesPinnedStart = (view: TimelineView, c: Candidate, ownId: string): boolean =>
  c.changes.some((ch) => ch.segmentId !== ownId && ch.field === 'startSeconds' && view.expected.get(ch.segmentId)?.pinnedStart === true);

/**
 * An EMOM's marks are held to the minute boundaries, not to lengths: a fix for another mark's
 * length that moves one of their boundaries would undo (or break) the minute rule, and the two
 * fixes would take turns. Such fixes are not offered; the EMOM's own fix moves its boundaries.
 */
const movesEmomMark = (view: TimelineView, c: Pick<Candidate, 'changes'>, ownId: string): boolean =>
  c.changes.some((ch) => ch.segmentId !== ownId && view.expected.get(ch.segmentId)?.planned.blockKind === 'emom');

/** Prefers moves that open no reportable gap, then that help the neighbour most, then no gap at all, then the end. */
function better(a: Candidate, b: Candidate): boolean {
  const ka = [a.reportableGap, a.excess - a.excessBefore, a.opensGap, a.side];
  const kb = [b.reportableGap, b.excess - b.excessBefore, b.opensGap, b.side];
  for (let i = 0; i < ka.length; i++) {
    if (ka[i]! !== kb[i]!) return ka[i]! < kb[i]!;
  }
  return false;
}

/** How far (ms) a segment of `lengthMs` would be beyond its tolerance (0 when fine or unplanned). */
function excessOf(view: TimelineView, segmentId: string, lengthMs: number): number {
  const exp = view.expected.get(segmentId);
  if (!exp) return 0;
  return Math.max(0, Math.abs(lengthMs - ms(exp.seconds)) - ms(exp.tolerance));
}

/** The planned length (ms) of a segment, or NaN when the plan gives it none. */
function plannedMs(view: TimelineView, segmentId: string): number {
  const exp = view.expected.get(segmentId);
  return exp ? ms(exp.seconds) : NaN;
}

/**
 * Changes that give the segment at sorted position `i` the length `targetSeconds`, or
 * undefined when no safe move exists.
 */
export function proposeResize(view: TimelineView, i: number, targetSeconds: number): FixChange[] | undefined {
  const segs = view.segments;
  const a = segs[i];
  if (!a) return undefined;
  const target = ms(targetSeconds);
  const start = ms(a.startSeconds);
  const end = ms(a.endSeconds);
  const gapTol = ms(view.tolerances.gapSeconds);
  const media = Number.isFinite(view.mediaSeconds) ? ms(view.mediaSeconds) : Infinity;
  const candidates: Candidate[] = [];
  const next = segs[i + 1];

  // Move the end.
  const newEnd = start + target;
  if (newEnd <= media && newEnd !== end) {
    const nextStart = next ? ms(next.startSeconds) : Infinity;
    const nextExcess = next ? excessOf(view, next.id, ms(next.endSeconds) - nextStart) : 0;
    if (newEnd < end || newEnd <= nextStart) {
      const gapBefore = nextStart - end;
      const gapAfter = nextStart - newEnd;
      const widens = next !== undefined && gapAfter > Math.max(gapBefore, 0);
      candidates.push({
        changes: [{ segmentId: a.id, field: 'endSeconds', value: sec(newEnd) }],
        // shrinking the last segment shortens the class: count it as opening unmarked time
        excessBefore: nextExcess,
        reportableGap: widens && gapAfter > gapTol ? 1 : 0,
        excess: nextExcess,
        opensGap: widens || (next === undefined && newEnd < end) ? 1 : 0,
        side: 0,
      });
    }
    // Back to back with the next segment, and nothing else overlaps: move the shared boundary.
    if (next && nextStart === end && view.holderBefore[i + 1] === i && newEnd < ms(next.endSeconds) && newEnd >= view.maxEndBefore[i]! * 1000 - 0.5) {
      const excess = excessOf(view, next.id, ms(next.endSeconds) - newEnd);
      candidates.push({
        changes: [
          { segmentId: a.id, field: 'endSeconds', value: sec(newEnd) },
          { segmentId: next.id, field: 'startSeconds', value: sec(newEnd) },
        ],
        excessBefore: nextExcess,
        reportableGap: 0,
        excess,
        opensGap: 0,
        side: 0,
      });
    }
  }

  // Move the start.
  const newStart = end - target;
  if (newStart >= 0 && newStart !== start) {
    const limit = view.maxEndBefore[i]! === -Infinity ? -Infinity : ms(view.maxEndBefore[i]!);
    const h = view.holderBefore[i]!;
    const prev = h >= 0 ? segs[h] : undefined;
    const prevExcess = prev ? excessOf(view, prev.id, ms(prev.endSeconds) - ms(prev.startSeconds)) : 0;
    if (newStart > start || newStart >= limit) {
      const gapBefore = start - limit;
      const gapAfter = newStart - limit;
      const widens = prev !== undefined && gapAfter > Math.max(gapBefore, 0);
      candidates.push({
        changes: [{ segmentId: a.id, field: 'startSeconds', value: sec(newStart) }],
        excessBefore: prevExcess,
        reportableGap: widens && gapAfter > gapTol ? 1 : 0,
        excess: prevExcess,
        opensGap: widens || (prev === undefined && newStart > start) ? 1 : 0,
        side: 1,
      });
    }
    if (prev && h === i - 1 && ms(prev.endSeconds) === start && newStart > ms(prev.startSeconds)) {
      const before = view.maxEndBefore[h]!;
      if (before === -Infinity || newStart >= ms(before)) {
        const excess = excessOf(view, prev.id, newStart - ms(prev.startSeconds));
        candidates.push({
          changes: [
            { segmentId: prev.id, field: 'endSeconds', value: sec(newStart) },
            { segmentId: a.id, field: 'startSeconds', value: sec(newStart) },
          ],
          excessBefore: prevExcess,
          reportableGap: 0,
          excess,
          opensGap: 0,
          side: 1,
        });
      }
    }
  }

  // Move the neighbour whole, and the boundary beyond it (for a neighbour that has its own
  // planned length and should keep it).
  const shiftNext = rippleNeighbours(view, i, 1, newEnd - end, media);
  if (newEnd <= media && shiftNext) candidates.push({ ...shiftNext, changes: [{ segmentId: a.id, field: 'endSeconds', value: sec(newEnd) }, ...shiftNext.changes], side: 0 });
  const shiftPrev = newStart >= 0 ? rippleNeighbours(view, i, -1, newStart - start, media) : undefined;
  if (shiftPrev) candidates.push({ ...shiftPrev, changes: [...shiftPrev.changes, { segmentId: a.id, field: 'startSeconds', value: sec(newStart) }], side: 1 });

  const both = growBothSides(view, i, target);
  if (both) candidates.push(both);

  let best: Candidate | undefined;
  for (const c of candidates) if (!harmful(c) && !movesPinnedStart(view, c, a.id) && !movesEmomMark(view, c, a.id) && (!best || better(c, best))) best = c;
  return best?.changes;
}

/**
 * Lengthens a segment squeezed between two back-to-back neighbours when neither side alone has
 * the room: the end takes what the next segment can give within its tolerance, the start takes
 * the rest from the previous one. Both neighbours must stay within (or move towards) tolerance.
 */
function growBothSides(view: TimelineView, i: number, target: number): Candidate | undefined {
  const segs = view.segments;
  const a = segs[i]!;
  const prev = segs[i - 1];
  const next = segs[i + 1];
  const start = ms(a.startSeconds);
  const end = ms(a.endSeconds);
  const need = target - (end - start);
  if (need <= 0 || !prev || !next) return undefined;
  const backToBack =
    ms(prev.endSeconds) === start && view.holderBefore[i] === i - 1 && ms(next.startSeconds) === end && view.holderBefore[i + 1] === i;
  if (!backToBack) return undefined;
  // Room each neighbour can give while staying at least 1 ms long and within its tolerance.
  const room = (n: typeof a) => {
    const len = ms(n.endSeconds) - ms(n.startSeconds);
    const exp = view.expected.get(n.id);
    const min = exp ? Math.max(1, ms(exp.seconds) - ms(exp.tolerance)) : 1;
    return Math.max(0, len - min);
  };
  const fromNext = Math.min(room(next), need);
  const fromPrev = need - fromNext;
  if (fromNext <= 0 || fromPrev <= 0 || fromPrev > room(prev)) return undefined;
  const prevStartLimit = view.maxEndBefore[i - 1];
  if (prevStartLimit !== undefined && prevStartLimit !== -Infinity && start - fromPrev < ms(prevStartLimit)) return undefined;
  const newStart = start - fromPrev;
  const newEnd = end + fromNext;
  const excessBefore =
    excessOf(view, prev.id, ms(prev.endSeconds) - ms(prev.startSeconds)) + excessOf(view, next.id, ms(next.endSeconds) - ms(next.startSeconds));
  const excess = excessOf(view, prev.id, newStart - ms(prev.startSeconds)) + excessOf(view, next.id, ms(next.endSeconds) - newEnd);
  return {
    changes: [
      { segmentId: prev.id, field: 'endSeconds', value: sec(newStart) },
      { segmentId: a.id, field: 'startSeconds', value: sec(newStart) },
      { segmentId: a.id, field: 'endSeconds', value: sec(newEnd) },
      { segmentId: next.id, field: 'startSeconds', value: sec(newEnd) },
    ],
    excessBefore,
    reportableGap: 0,
    excess,
    opensGap: 0,
    side: 1,
  };
}

/** How many neighbours a fix may move whole before giving up. */
const MAX_RIPPLE = 64;

/**
 * Moves the segments after (`dir` 1) or before (`dir` -1) segment `ai` by `delta` ms without
 * changing their lengths, as many as needed until one can take up the change within its
 * tolerance (its facing boundary moves), unmarked time can, or the recording's edge is reached.
 * Only along back-to-back chains with nothing else overlapping them.
 */
function rippleNeighbours(view: TimelineView, ai: number, dir: 1 | -1, delta: number, media: number): Omit<Candidate, 'side'> | undefined {
  const segs = view.segments;
  if (delta === 0) return undefined;
  const changes: FixChange[] = [];
  let prevIdx = ai;
  for (let k = 1; k <= MAX_RIPPLE; k++) {
    const ni = ai + dir * k;
    const n = segs[ni];
    const p = segs[prevIdx]!;
    if (!n) return undefined;
    const adjacent = dir === 1
      ? ms(n.startSeconds) === ms(p.endSeconds) && view.holderBefore[ni] === prevIdx
      : ms(n.endSeconds) === ms(p.startSeconds) && view.holderBefore[prevIdx] === ni;
    if (!adjacent) return undefined;
    const nStart = ms(n.startSeconds) + delta;
    const nEnd = ms(n.endSeconds) + delta;
    if (nStart < 0 || nEnd > media) return undefined;
    changes.push({ segmentId: n.id, field: 'startSeconds', value: sec(nStart) }, { segmentId: n.id, field: 'endSeconds', value: sec(nEnd) });
    const fi = ni + dir;
    const f = segs[fi];
    const fAdjacent = f !== undefined && (dir === 1
      ? ms(f.startSeconds) === ms(n.endSeconds) && view.holderBefore[fi] === ni
      : ms(f.endSeconds) === ms(n.startSeconds) && view.holderBefore[ni] === fi);
    if (!fAdjacent) {
      // Unmarked time (or the class edge) beyond: the moved chain must not run into anything.
      const blocked = dir === 1 ? f !== undefined && nEnd > ms(f.startSeconds) : nStart < (view.maxEndBefore[ni]! === -Infinity ? 0 : ms(view.maxEndBefore[ni]!));
      return blocked ? undefined : { changes, excessBefore: 0, reportableGap: 0, excess: 0, opensGap: 0 };
    }
    const fLen = dir === 1 ? ms(f.endSeconds) - nEnd : nStart - ms(f.startSeconds);
    const before = excessOf(view, f.id, ms(f.endSeconds) - ms(f.startSeconds));
    const after = fLen > 0 ? excessOf(view, f.id, fLen) : Infinity;
    // The neighbour taking up the change must end within its tolerance, or closer to it on the
    // same side: a too-long neighbour turned too short (or the reverse) would be fixed back by
    // the next round, and the two findings would take turns.
    const sameSide = Math.sign(fLen - plannedMs(view, f.id)) === Math.sign(ms(f.endSeconds) - ms(f.startSeconds) - plannedMs(view, f.id));
    if (fLen > 0 && (after === 0 || (after < before && sameSide))) {
      changes.push({ segmentId: f.id, field: dir === 1 ? 'startSeconds' : 'endSeconds', value: sec(dir === 1 ? nEnd : nStart) });
      return { changes, excessBefore: before, reportableGap: 0, excess: after, opensGap: 0 };
    }
    prevIdx = ni;
  }
  return undefined;
}

/**
 * Makes two overlapping segments back to back (or, when the later one sits inside the
 * earlier one, ends the earlier one where the later one starts). `ai` holds the largest end
 * before `bi`. The boundary goes where the earlier segment gets its planned length if it has
 * one, else where the later one does.
 */
export function proposeOverlapFix(view: TimelineView, ai: number, bi: number): FixChange[] | undefined {
  const a = view.segments[ai];
  const b = view.segments[bi];
  if (!a || !b) return undefined;
  const aStart = ms(a.startSeconds);
  const aEnd = ms(a.endSeconds);
  const bStart = ms(b.startSeconds);
  const bEnd = ms(b.endSeconds);
  if (bEnd <= aEnd) {
    return bStart > aStart ? [{ segmentId: a.id, field: 'endSeconds', value: sec(bStart) }] : undefined;
  }
  const lo = bStart;
  const hi = aEnd;
  const expA = view.expected.get(a.id);
  const expB = view.expected.get(b.id);
  let v = expA ? aStart + ms(expA.seconds) : expB ? bEnd - ms(expB.seconds) : lo;
  v = Math.min(hi, Math.max(lo, v));
  if (v <= aStart) v = hi;
  const changes: FixChange[] = [];
  if (v < aEnd) changes.push({ segmentId: a.id, field: 'endSeconds', value: sec(v) });
  if (v > bStart) changes.push({ segmentId: b.id, field: 'startSeconds', value: sec(v) });
  return changes.length > 0 ? changes : undefined;
}

/** Kinds with no planned length: they may absorb a gap. */
const FREE_KINDS = new Set(['intro', 'outro']);

/**
 * Closes a gap between `ai` (holding the largest end so far) and `bi` at one boundary that
 * keeps both segments within their tolerances; none when no such boundary exists (for
 * example when the gap is a station nobody marked).
 */
export function proposeGapFix(view: TimelineView, ai: number, bi: number): FixChange[] | undefined {
  const a = view.segments[ai];
  const b = view.segments[bi];
  if (!a || !b) return undefined;
  const aStart = ms(a.startSeconds);
  const aEnd = ms(a.endSeconds);
  const bStart = ms(b.startSeconds);
  const bEnd = ms(b.endSeconds);
  let lo = aEnd;
  let hi = bStart;
  const expA = view.expected.get(a.id);
  const expB = view.expected.get(b.id);
  if (expA) {
    lo = Math.max(lo, aStart + ms(expA.seconds) - ms(expA.tolerance));
    hi = Math.min(hi, aStart + ms(expA.seconds) + ms(expA.tolerance));
  } else if (!FREE_KINDS.has(a.kind)) {
    hi = Math.min(hi, aEnd); // a segment the plan does not account for keeps its length
  }
  if (expB) {
    lo = Math.max(lo, bEnd - ms(expB.seconds) - ms(expB.tolerance));
    hi = Math.min(hi, bEnd - ms(expB.seconds) + ms(expB.tolerance));
  } else if (!FREE_KINDS.has(b.kind)) {
    lo = Math.max(lo, bStart);
  }
  if (lo > hi) return undefined;
  let v = expA ? aStart + ms(expA.seconds) : expB ? bEnd - ms(expB.seconds) : hi;
  v = Math.min(hi, Math.max(lo, v));
  const changes: FixChange[] = [];
  if (v > aEnd) changes.push({ segmentId: a.id, field: 'endSeconds', value: sec(v) });
  if (v < bStart) changes.push({ segmentId: b.id, field: 'startSeconds', value: sec(v) });
  return changes.length > 0 ? changes : undefined;
}

/** Ends a segment at the end of the recording, when it starts inside it. */
export function proposeMediaFix(view: TimelineView, i: number): FixChange[] | undefined {
  const a = view.segments[i];
  if (!a || !Number.isFinite(view.mediaSeconds) || a.startSeconds >= view.mediaSeconds) return undefined;
  return [{ segmentId: a.id, field: 'endSeconds', value: view.mediaSeconds }];
}

/**
 * Moves one boundary of segment `i` to `valueSeconds`; when a neighbour shares that boundary
 * (back to back, nothing else overlapping), it moves with it, so no gap or overlap opens.
 * Undefined when the move would turn a segment inside out, cross another mark or leave the
 * recording. Used where the rule is a point in time (an EMOM's minute boundaries), not a length.
 */
export function proposeBoundaryMove(view: TimelineView, i: number, edge: 'start' | 'end', valueSeconds: number): FixChange[] | undefined {
  const segs = view.segments;
  const a = segs[i];
  if (!a) return undefined;
  const v = ms(valueSeconds);
  const media = Number.isFinite(view.mediaSeconds) ? ms(view.mediaSeconds) : Infinity;
  if (v < 0 || v > media) return undefined;
  const start = ms(a.startSeconds);
  const end = ms(a.endSeconds);
  if (edge === 'start') {
    if (v >= end || v === start) return undefined;
    const own: FixChange = { segmentId: a.id, field: 'startSeconds', value: sec(v) };
    const h = view.holderBefore[i]!;
    const prev = h >= 0 ? segs[h] : undefined;
    if (prev && h === i - 1 && ms(prev.endSeconds) === start) {
      const before = view.maxEndBefore[h]!;
      if (v <= ms(prev.startSeconds) || (before !== -Infinity && v < ms(before))) return undefined;
      return [{ segmentId: prev.id, field: 'endSeconds', value: sec(v) }, own];
    }
    const limit = view.maxEndBefore[i]!;
    return limit !== -Infinity && v < ms(limit) && v < start ? undefined : [own];
  }
  if (v <= start || v === end) return undefined;
  const own: FixChange = { segmentId: a.id, field: 'endSeconds', value: sec(v) };
  const next = segs[i + 1];
  if (next && view.holderBefore[i + 1] === i && ms(next.startSeconds) === end) {
    if (v >= ms(next.endSeconds)) return undefined;
    return [own, { segmentId: next.id, field: 'startSeconds', value: sec(v) }];
  }
  return next && v > ms(next.startSeconds) ? undefined : [own];
}

/**
 * True when `changes` push any segment other than `ownId` (further) beyond its tolerance: such a
 * fix only trades one finding for another, and repeated fixing would go back and forth.
 */
function harmsOthers(view: TimelineView, changes: readonly FixChange[], ownId: string): boolean {
  const moved = new Map<string, { start: number; end: number }>();
  for (const c of changes) {
    if (c.segmentId === ownId) continue;
    const pos = view.position.get(c.segmentId);
    const seg = pos === undefined ? undefined : view.segments[pos];
    if (!seg) continue;
    const m = moved.get(c.segmentId) ?? { start: ms(seg.startSeconds), end: ms(seg.endSeconds) };
    if (c.field === 'startSeconds') m.start = ms(c.value);
    else m.end = ms(c.value);
    moved.set(c.segmentId, m);
  }
  for (const [id, m] of moved) {
    const seg = view.segments[view.position.get(id)!]!;
    if (excessOf(view, id, m.end - m.start) > excessOf(view, id, ms(seg.endSeconds) - ms(seg.startSeconds))) return true;
  }
  return false;
}

/**
 * Starts segment `i` at `valueSeconds`, for a rule about a point in time (an EMOM's top of the
 * minute). In order of preference: its start moves alone (with a neighbour sharing it); the
 * segments before it move whole so they keep their planned lengths; or, when the start alone
 * would turn the segment inside out, the whole segment moves keeping its length and takes the
 * shared boundaries on both sides with it. A move that pushes another segment (further) beyond
 * its tolerance is never chosen. Undefined when none fits.
 */
export function proposeStartAt(view: TimelineView, i: number, valueSeconds: number): FixChange[] | undefined {
  const segs = view.segments;
  const a = segs[i];
  if (!a) return undefined;
  const direct = proposeBoundaryMove(view, i, 'start', valueSeconds);
  if (direct && !harmsOthers(view, direct, a.id)) return direct;
  const v = ms(valueSeconds);
  const media = Number.isFinite(view.mediaSeconds) ? ms(view.mediaSeconds) : Infinity;
  if (v < ms(a.endSeconds)) {
    const ripple = rippleNeighbours(view, i, -1, v - ms(a.startSeconds), media);
    const changes = ripple ? [...ripple.changes, { segmentId: a.id, field: 'startSeconds' as const, value: sec(v) }] : undefined;
    if (changes && !harmsOthers(view, changes, a.id) && !movesPinnedStart(view, { changes } as Candidate, a.id)) return changes;
  }
  if (direct) return undefined;
  const whole = moveWholeTo(view, i, v, media);
  return whole && !harmsOthers(view, whole, a.id) && !movesPinnedStart(view, { changes: whole } as Candidate, a.id) ? whole : undefined;
}

/** Moves segment `i` whole so it starts at `v` ms, with the boundaries it shares. */
function moveWholeTo(view: TimelineView, i: number, v: number, media: number): FixChange[] | undefined {
  const segs = view.segments;
  const a = segs[i]!;
  const len = ms(a.endSeconds) - ms(a.startSeconds);
  if (v < 0 || v + len > media || v === ms(a.startSeconds)) return undefined;
  const changes: FixChange[] = [];
  const h = view.holderBefore[i]!;
  const prev = h >= 0 ? segs[h] : undefined;
  if (prev && h === i - 1 && ms(prev.endSeconds) === ms(a.startSeconds)) {
    const before = view.maxEndBefore[h]!;
    if (v <= ms(prev.startSeconds) || (before !== -Infinity && v < ms(before))) return undefined;
    changes.push({ segmentId: prev.id, field: 'endSeconds', value: sec(v) });
  } else if (view.maxEndBefore[i]! !== -Infinity && v < ms(view.maxEndBefore[i]!)) return undefined;
  changes.push({ segmentId: a.id, field: 'startSeconds', value: sec(v) }, { segmentId: a.id, field: 'endSeconds', value: sec(v + len) });
  const next = segs[i + 1];
  if (next && view.holderBefore[i + 1] === i && ms(next.startSeconds) === ms(a.endSeconds)) {
    if (v + len >= ms(next.endSeconds)) return undefined;
    changes.push({ segmentId: next.id, field: 'startSeconds', value: sec(v + len) });
  } else if (next && v + len > ms(next.startSeconds)) return undefined;
  return changes;
}

/**
 * Ends segment `i` at `valueSeconds`, for a rule about a point in time (an EMOM's last minute).
 * The shared boundary moves with the next segment when that does not push it (further) beyond
 * its own tolerance; otherwise the next segments move whole (`rippleNeighbours`) so they keep
 * their planned lengths. Undefined when neither fits: a fix that only trades this finding for the
 * neighbour's would make repeated fixing go back and forth.
 */
export function proposeEndAt(view: TimelineView, i: number, valueSeconds: number): FixChange[] | undefined {
  const segs = view.segments;
  const a = segs[i];
  if (!a) return undefined;
  const v = ms(valueSeconds);
  const direct = proposeBoundaryMove(view, i, 'end', valueSeconds);
  const next = segs[i + 1];
  const movesNext = direct?.some((c) => c.segmentId !== a.id) === true;
  if (direct && (!movesNext || !next)) return direct;
  // The next segment's start is a top of a minute of its own: neither moving it nor moving it
  // whole helps, the two rules would take turns. Leave the finding without a fix.
  if (direct && movesPinnedStart(view, { changes: direct } as Candidate, a.id)) return undefined;
  if (direct && next) {
    const before = excessOf(view, next.id, ms(next.endSeconds) - ms(next.startSeconds));
    if (excessOf(view, next.id, ms(next.endSeconds) - v) <= before) return direct;
  }
  if (v <= ms(a.startSeconds)) return undefined;
  const media = Number.isFinite(view.mediaSeconds) ? ms(view.mediaSeconds) : Infinity;
  if (v > media) return undefined;
  const ripple = rippleNeighbours(view, i, 1, v - ms(a.endSeconds), media);
  if (!ripple || ripple.excess > ripple.excessBefore) return undefined;
  const candidate = { ...ripple, changes: [{ segmentId: a.id, field: 'endSeconds' as const, value: sec(v) }, ...ripple.changes], side: 0 };
  return movesPinnedStart(view, candidate, a.id) ? undefined : candidate.changes;
}
