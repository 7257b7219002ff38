/**
 * The timeline editor's state: the timeline being marked, what is selected, and unbounded
 * undo/redo within the session. A pure reducer: the island dispatches actions, tests call it
 * directly. Times are rounded to milliseconds like every stored time.
 */
import { expandPlan, markFieldsOf } from '../plan/expand-plan';
import type { Plan } from '../plan/plan-schema';
import { segmentSchema, type Cue, type CueKind, type Segment, type SegmentKind, type SegmentSide, type Timeline } from '../timeline/timeline-schema';
import { formatEditorTime, roundToMillis } from '../time/format-time';
import { applyFix, applyNonConflictingFixes } from '../timing/apply-fix';
import type { Finding } from '../timing/finding-types';

import { MIN_SEGMENT_SECONDS, SAME_TIME } from './edit-limits';
import { moveSegment } from './segment-move';

export { MIN_SEGMENT_SECONDS } from './edit-limits';

export type Edge = 'start' | 'end';
export type Selection =
  | { type: 'segment'; id: string; edge: Edge | null }
  | { type: 'cue'; id: string }
  | null;

export interface EditorState {
  timeline: Timeline;
  selection: Selection;
  /** Earlier timelines, oldest first (unbounded within the session). */
  past: Timeline[];
  future: Timeline[];
  /** Length of the recording (or the class's media length), for clamping and new segments. */
  mediaSeconds: number;
  /** A short message about the last action (shown in a live region), or null. */
  notice: string | null;
}

export type EditorAction =
  | { type: 'replace'; timeline: Timeline; keepHistory?: boolean; notice?: string }
  | { type: 'select'; selection: Selection }
  | { type: 'split'; at: number }
  | { type: 'set-kind'; kind: SegmentKind; segmentId?: string }
  | { type: 'set-exercise'; exercise: string; segmentId?: string }
  /** Title, round, set or side of a segment; null (or an empty title) takes the field away. */
  | { type: 'set-details'; details: SegmentDetails; segmentId?: string }
  | { type: 'nudge'; delta: number }
  | { type: 'move-edge'; segmentId: string; edge: Edge; to: number; linked?: boolean }
  /** The whole segment (both edges) to start at `to`, or by `delta` seconds; the selected one unless named. */
  | { type: 'move-segment'; segmentId?: string; to?: number; delta?: number }
  | { type: 'move-cue'; cueId: string; to: number }
  | { type: 'add-cue'; at: number; kind?: CueKind; text?: string }
  | { type: 'set-cue'; cueId: string; kind?: CueKind; text?: string }
  | { type: 'delete' }
  | { type: 'select-boundary'; from: number; direction: 1 | -1 }
  | { type: 'layout-from-plan'; plan: Plan; at: number }
  | { type: 'insert-segment'; segment: Omit<Segment, 'id'>; notice?: string }
  | { type: 'set-media-seconds'; seconds: number }
  | { type: 'apply-fix'; finding: Finding }
  | { type: 'apply-fixes'; findings: readonly Finding[] }
  | { type: 'undo' }
  | { type: 'redo' };

export function initialEditorState(timeline: Timeline, mediaSeconds: number): EditorState {
  return { timeline: sortTimeline(timeline), selection: null, past: [], future: [], mediaSeconds, notice: null };
}

/** Segments by start (then end), cues by time: the order every view and the diff expect. */
export function sortTimeline(t: Timeline): Timeline {
  return {
    segments: [...t.segments].sort((a, b) => a.startSeconds - b.startSeconds || a.endSeconds - b.endSeconds || cmp(a.id, b.id)),
    cues: [...t.cues].sort((a, b) => a.atSeconds - b.atSeconds || cmp(a.id, b.id)),
  };
}
const cmp = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);

/** A new id with `prefix` not used by any segment or cue. Deterministic, so the reducer stays pure. */
export function freshId(t: Timeline, prefix: string): string {
  const used = new Set<string>();
  for (const s of t.segments) used.add(s.id);
  for (const c of t.cues) used.add(c.id);
  let n = used.size + 1;
  while (used.has(`${prefix}${n}`)) n++;
  return `${prefix}${n}`;
}

/** The segment under the playhead (the latest-starting one when marks overlap). */
export function segmentAt(t: Timeline, at: number): Segment | undefined {
  let found: Segment | undefined;
  for (const s of t.segments) if (s.startSeconds <= at && at < s.endSeconds) found = s;
  return found;
}

/** Every distinct boundary time, ascending. */
export function boundaries(t: Timeline): number[] {
  const all = t.segments.flatMap((s) => [s.startSeconds, s.endSeconds]).sort((a, b) => a - b);
  const out: number[] = [];
  for (const v of all) if (out.length === 0 || v - (out[out.length - 1] as number) > SAME_TIME) out.push(v);
  return out;
}

const clamp = (v: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, v));

/** Commits a new timeline: the old one goes on the undo stack and redo is cleared. */
function commit(state: EditorState, timeline: Timeline, selection: Selection = state.selection, notice: string | null = null): EditorState {
  return { ...state, timeline: sortTimeline(timeline), selection, past: [...state.past, state.timeline], future: [], notice };
}

function selectedSegment(state: EditorState, id?: string): Segment | undefined {
  const wanted = id ?? (state.selection?.type === 'segment' ? state.selection.id : undefined);
  return wanted === undefined ? undefined : state.timeline.segments.find((s) => s.id === wanted);
}

function replaceSegment(t: Timeline, next: Segment): Timeline {
  return { ...t, segments: t.segments.map((s) => (s.id === next.id ? next : s)) };
}

/**
 * Puts `segment` at its times, over whatever is marked there: segments it covers go, segments
 * it cuts into are trimmed (one that spans it is split in two). Pieces shorter than
 * MIN_SEGMENT_SECONDS are dropped. Returns the timeline and the new segment's id.
 */
export function insertSegment(t: Timeline, segment: Omit<Segment, 'id'>, mediaSeconds = Infinity): { timeline: Timeline; id: string } {
  const start = roundToMillis(clamp(segment.startSeconds, 0, mediaSeconds));
  const end = roundToMillis(clamp(segment.endSeconds, start, mediaSeconds));
  const id = freshId(t, 'm');
  const kept: Segment[] = [];
  let n = 0;
  for (const s of t.segments) {
    if (s.endSeconds <= start + SAME_TIME || s.startSeconds >= end - SAME_TIME) {
      kept.push(s);
      continue;
    }
    if (s.startSeconds < start && start - s.startSeconds >= MIN_SEGMENT_SECONDS) kept.push({ ...s, endSeconds: start });
    if (s.endSeconds > end && s.endSeconds - end >= MIN_SEGMENT_SECONDS) {
      // The right-hand piece keeps the id when there is no left-hand piece.
      const leftKept = s.startSeconds < start && start - s.startSeconds >= MIN_SEGMENT_SECONDS;
      const pieceId = leftKept ? freshId({ segments: [...t.segments, ...kept, { ...s, id }], cues: t.cues }, `m${++n}-`) : s.id;
      kept.push({ ...s, id: pieceId, startSeconds: end });
    }
  }
  return { timeline: { segments: [...kept, { ...segment, id, startSeconds: start, endSeconds: end }], cues: t.cues }, id };
}

/**
 * Moves one edge of a segment to `to`. When `linked`, a neighbour's edge at the same time
 * (a shared boundary) moves with it. Each segment keeps at least MIN_SEGMENT_SECONDS.
 */
export function moveEdge(t: Timeline, segmentId: string, edge: Edge, to: number, linked = true, mediaSeconds = Infinity): Timeline {
  const seg = t.segments.find((s) => s.id === segmentId);
  if (!seg) return t;
  const from = edge === 'start' ? seg.startSeconds : seg.endSeconds;
  const partners = linked
    ? t.segments.filter((s) => s.id !== segmentId && Math.abs((edge === 'start' ? s.endSeconds : s.startSeconds) - from) < SAME_TIME)
    : [];
  let lo = 0;
  let hi = mediaSeconds;
  if (edge === 'start') hi = Math.min(hi, seg.endSeconds - MIN_SEGMENT_SECONDS);
  else lo = Math.max(lo, seg.startSeconds + MIN_SEGMENT_SECONDS);
  for (const p of partners) {
    if (edge === 'start') lo = Math.max(lo, p.startSeconds + MIN_SEGMENT_SECONDS); // partner's end moves
    else hi = Math.min(hi, p.endSeconds - MIN_SEGMENT_SECONDS); // partner's start moves
  }
  if (lo > hi) return t;
  const value = roundToMillis(clamp(to, lo, hi));
  const ids = new Set(partners.map((p) => p.id));
  return {
    ...t,
    segments: t.segments.map((s) => {
      if (s.id === segmentId) return edge === 'start' ? { ...s, startSeconds: value } : { ...s, endSeconds: value };
      if (ids.has(s.id)) return edge === 'start' ? { ...s, endSeconds: value } : { ...s, startSeconds: value };
      return s;
    }),
  };
}

/**
 * Lays the plan's expected schedule out from `at`: planned segments with their planned lengths
 * and exercise names replace every mark that overlaps the span they cover. Cues stay.
 */
export function layoutFromPlan(t: Timeline, plan: Plan, at: number): Timeline {
  const schedule = expandPlan(plan, roundToMillis(at));
  const end = schedule.startSeconds + schedule.totals.classSeconds;
  const kept = t.segments.filter((s) => s.endSeconds <= schedule.startSeconds + SAME_TIME || s.startSeconds >= end - SAME_TIME);
  let next: Timeline = { segments: kept, cues: t.cues };
  const added: Segment[] = [];
  for (const p of schedule.segments) {
    const id = freshId({ segments: [...kept, ...added], cues: t.cues }, 'p');
    const seg: Segment = {
      id,
      kind: p.kind,
      startSeconds: roundToMillis(p.startSeconds),
      endSeconds: roundToMillis(p.startSeconds + p.seconds),
      ...markFieldsOf(p),
    };
    added.push(seg);
  }
  next = { segments: [...kept, ...added], cues: t.cues };
  return next;
}

export function editorReducer(state: EditorState, action: EditorAction): EditorState {
  switch (action.type) {
    case 'replace': {
      const timeline = sortTimeline(action.timeline);
      if (action.keepHistory) return commit(state, timeline, null, action.notice ?? null);
      return { ...state, timeline, selection: null, past: [], future: [], notice: action.notice ?? null };
    }
    case 'select':
      return { ...state, selection: action.selection, notice: null };
    case 'split': {
      const at = roundToMillis(clamp(action.at, 0, state.mediaSeconds));
      const seg = segmentAt(state.timeline, at);
      if (seg) {
        if (at - seg.startSeconds < MIN_SEGMENT_SECONDS || seg.endSeconds - at < MIN_SEGMENT_SECONDS) {
          return { ...state, notice: 'Too close to a boundary to split here. Move the playhead a little further in.' };
        }
        const id = freshId(state.timeline, 'm');
        const second: Segment = { ...seg, id, startSeconds: at };
        const timeline = { ...state.timeline, segments: [...replaceSegment(state.timeline, { ...seg, endSeconds: at }).segments, second] };
        return commit(state, timeline, { type: 'segment', id, edge: 'start' }, null);
      }
      // Nothing marked here: start a new segment that runs to the next mark (or the end).
      const next = state.timeline.segments.filter((s) => s.startSeconds > at).reduce((m, s) => Math.min(m, s.startSeconds), state.mediaSeconds);
      if (next - at < MIN_SEGMENT_SECONDS) return { ...state, notice: 'There is no room for a new segment here.' };
      const id = freshId(state.timeline, 'm');
      const created: Segment = { id, kind: 'talk', startSeconds: at, endSeconds: roundToMillis(next) };
      return commit(state, { ...state.timeline, segments: [...state.timeline.segments, created] }, { type: 'segment', id, edge: 'start' });
    }
    case 'set-kind': {
      const seg = selectedSegment(state, action.segmentId);
      if (!seg || seg.kind === action.kind) return state;
      const next: Segment = { ...seg, kind: action.kind };
      // An exercise belongs to work and rest only; the others drop it.
      if (action.kind !== 'work' && action.kind !== 'rest') delete next.exercise;
      return commit(state, replaceSegment(state.timeline, next));
    }
    case 'set-exercise': {
      const seg = selectedSegment(state, action.segmentId);
      if (!seg) return state;
      const exercise = action.exercise.trim();
      if ((seg.exercise ?? '') === exercise) return state;
      const next: Segment = { ...seg };
      if (exercise) next.exercise = exercise;
      else delete next.exercise;
      return commit(state, replaceSegment(state.timeline, next));
    }
    case 'set-details': {
      const seg = selectedSegment(state, action.segmentId);
      if (!seg) return state;
      const next = withDetails(seg, action.details);
      if (!next.ok) return { ...state, notice: next.message };
      if (sameTimeline({ segments: [seg], cues: [] }, { segments: [next.segment], cues: [] })) return state;
      return commit(state, replaceSegment(state.timeline, next.segment));
    }
    case 'nudge': {
      const sel = state.selection;
      if (sel?.type === 'cue') {
        const cue = state.timeline.cues.find((c) => c.id === sel.id);
        if (!cue) return state;
        return reduceMoveCue(state, cue, cue.atSeconds + action.delta);
      }
      if (sel?.type === 'segment') {
        const seg = selectedSegment(state);
        if (!seg) return state;
        const edge = sel.edge ?? 'start';
        const from = edge === 'start' ? seg.startSeconds : seg.endSeconds;
        const timeline = moveEdge(state.timeline, seg.id, edge, from + action.delta, true, state.mediaSeconds);
        if (timeline === state.timeline) return state;
        return commit(state, timeline, { type: 'segment', id: seg.id, edge });
      }
      return { ...state, notice: 'Select a segment or a cue first, then nudge it.' };
    }
    case 'move-edge': {
      const timeline = moveEdge(state.timeline, action.segmentId, action.edge, action.to, action.linked ?? true, state.mediaSeconds);
      if (timeline === state.timeline) return state;
      return commit(state, timeline, { type: 'segment', id: action.segmentId, edge: action.edge });
    }
    case 'move-segment': {
      const seg = selectedSegment(state, action.segmentId);
      if (!seg) return { ...state, notice: 'Select a segment first, then move it.' };
      const moved = moveSegment(state.timeline, seg.id, action.to ?? seg.startSeconds + (action.delta ?? 0), state.mediaSeconds);
      if (!moved.ok) return { ...state, selection: { type: 'segment', id: seg.id, edge: null }, notice: moved.message };
      const notice = moved.clamped ? `Moved as far as there is room: it starts at ${formatEditorTime(moved.startSeconds)}.` : null;
      return commit(state, moved.timeline, { type: 'segment', id: seg.id, edge: null }, notice);
    }
    case 'move-cue': {
      const cue = state.timeline.cues.find((c) => c.id === action.cueId);
      return cue ? reduceMoveCue(state, cue, action.to) : state;
    }
    case 'add-cue': {
      const id = freshId(state.timeline, 'q');
      const cue: Cue = {
        id,
        atSeconds: roundToMillis(clamp(action.at, 0, state.mediaSeconds)),
        kind: action.kind ?? 'note',
        text: action.text?.trim() || 'New cue',
      };
      return commit(state, { ...state.timeline, cues: [...state.timeline.cues, cue] }, { type: 'cue', id });
    }
    case 'set-cue': {
      const cue = state.timeline.cues.find((c) => c.id === action.cueId);
      if (!cue) return state;
      const text = action.text?.trim();
      const next: Cue = { ...cue, ...(action.kind ? { kind: action.kind } : {}), ...(text ? { text } : {}) };
      if (next.kind === cue.kind && next.text === cue.text) return state;
      return commit(state, { ...state.timeline, cues: state.timeline.cues.map((c) => (c.id === cue.id ? next : c)) });
    }
    case 'delete': {
      const sel = state.selection;
      if (sel?.type === 'cue') {
        return commit(state, { ...state.timeline, cues: state.timeline.cues.filter((c) => c.id !== sel.id) }, null, 'Cue deleted.');
      }
      if (sel?.type === 'segment') {
        const seg = selectedSegment(state);
        if (!seg) return state;
        // With an edge selected, delete removes that boundary: the two segments meeting there merge.
        if (sel.edge) {
          const at = sel.edge === 'start' ? seg.startSeconds : seg.endSeconds;
          const other = state.timeline.segments.find((s) =>
            s.id !== seg.id && Math.abs((sel.edge === 'start' ? s.endSeconds : s.startSeconds) - at) < SAME_TIME,
          );
          if (other) {
            const [first, second] = sel.edge === 'start' ? [other, seg] : [seg, other];
            const merged: Segment = { ...first, endSeconds: second.endSeconds };
            const timeline = { ...state.timeline, segments: state.timeline.segments.filter((s) => s.id !== second.id).map((s) => (s.id === first.id ? merged : s)) };
            return commit(state, timeline, { type: 'segment', id: first.id, edge: null }, 'Boundary removed: the two segments are one now.');
          }
        }
        return commit(state, { ...state.timeline, segments: state.timeline.segments.filter((s) => s.id !== seg.id) }, null, 'Segment deleted.');
      }
      return { ...state, notice: 'Select a segment or a cue first, then delete it.' };
    }
    case 'select-boundary': {
      const list = boundaries(state.timeline);
      const target = action.direction > 0
        ? list.find((b) => b > action.from + SAME_TIME)
        : [...list].reverse().find((b) => b < action.from - SAME_TIME);
      if (target === undefined) return { ...state, notice: action.direction > 0 ? 'No boundary after the playhead.' : 'No boundary before the playhead.' };
      // Prefer the segment that starts at the boundary; else the one that ends there.
      const starting = state.timeline.segments.find((s) => Math.abs(s.startSeconds - target) < SAME_TIME);
      const ending = state.timeline.segments.find((s) => Math.abs(s.endSeconds - target) < SAME_TIME);
      const selection: Selection = starting ? { type: 'segment', id: starting.id, edge: 'start' } : { type: 'segment', id: ending!.id, edge: 'end' };
      return { ...state, selection, notice: null };
    }
    case 'layout-from-plan': {
      const timeline = layoutFromPlan(state.timeline, action.plan, action.at);
      const count = expandPlan(action.plan, 0).segments.length;
      return commit(state, timeline, null, `Laid out ${count} planned segments from the playhead. Nudge them to the recording.`);
    }
    case 'set-media-seconds':
      return action.seconds === state.mediaSeconds ? state : { ...state, mediaSeconds: action.seconds };
    case 'insert-segment': {
      if (action.segment.endSeconds - action.segment.startSeconds < MIN_SEGMENT_SECONDS) {
        return { ...state, notice: 'There is no room for that segment here.' };
      }
      const { timeline, id } = insertSegment(state.timeline, action.segment, state.mediaSeconds);
      return commit(state, timeline, { type: 'segment', id, edge: null }, action.notice ?? null);
    }
    case 'apply-fix': {
      try {
        const timeline = applyFix(state.timeline, action.finding);
        if (timeline === state.timeline) return { ...state, notice: 'This finding has no suggested fix.' };
        const id = action.finding.segmentIds[0];
        return commit(state, timeline, id ? { type: 'segment', id, edge: null } : state.selection, 'Fix applied.');
      } catch (err) {
        return { ...state, notice: err instanceof Error ? err.message : 'The fix could not be applied.' };
      }
    }
    case 'apply-fixes': {
      try {
        const { timeline, applied } = applyNonConflictingFixes(state.timeline, action.findings);
        if (applied.length === 0) return { ...state, notice: 'No suggested fixes to apply.' };
        const skipped = action.findings.filter((f) => f.fix).length - applied.length;
        const notice = appliedFixesNotice(applied.length, skipped);
        return commit(state, timeline, state.selection, notice);
      } catch (err) {
        return { ...state, notice: err instanceof Error ? err.message : 'The fixes could not be applied.' };
      }
    }
    case 'undo': {
      const previous = state.past[state.past.length - 1];
      if (!previous) return { ...state, notice: 'Nothing to undo.' };
      return { ...state, timeline: previous, past: state.past.slice(0, -1), future: [state.timeline, ...state.future], selection: keepSelection(previous, state.selection), notice: 'Undone.' };
    }
    case 'redo': {
      const next = state.future[0];
      if (!next) return { ...state, notice: 'Nothing to redo.' };
      return { ...state, timeline: next, past: [...state.past, state.timeline], future: state.future.slice(1), selection: keepSelection(next, state.selection), notice: 'Redone.' };
    }
  }
}

function reduceMoveCue(state: EditorState, cue: Cue, to: number): EditorState {
  const atSeconds = roundToMillis(clamp(to, 0, state.mediaSeconds));
  if (atSeconds === cue.atSeconds) return state;
  return commit(state, { ...state.timeline, cues: state.timeline.cues.map((c) => (c.id === cue.id ? { ...c, atSeconds } : c)) }, { type: 'cue', id: cue.id });
}

function keepSelection(t: Timeline, sel: Selection): Selection {
  if (!sel) return null;
  const exists = sel.type === 'cue' ? t.cues.some((c) => c.id === sel.id) : t.segments.some((s) => s.id === sel.id);
  return exists ? sel : null;
}

/** Whether two timelines hold the same marks (order ignored). */
export function sameTimeline(a: Timeline, b: Timeline): boolean {
  return canonicalJson(a) === canonicalJson(b);
}

/** The timeline as JSON with a fixed order of items and keys, for comparisons. */
export function canonicalJson(t: Timeline): string {
  const s = sortTimeline(t);
  return JSON.stringify({
    segments: s.segments.map((x) => [x.id, x.kind, x.startSeconds, x.endSeconds, x.exercise ?? null, x.round ?? null, x.set ?? null, x.title ?? null, x.side ?? null, x.format ?? null]),
    cues: s.cues.map((c) => [c.id, c.atSeconds, c.kind, c.text]),
  });
}

/**
 * What "Apply all fixes" reports. Fixes that touch segments another fix already changed are left
 * for a second press (their suggestion was computed on the old timeline).
 */
export function appliedFixesNotice(applied: number, skipped: number): string {
  const fixes = (n: number) => `${n} ${n === 1 ? 'fix' : 'fixes'}`;
  if (skipped === 0) return `Applied ${fixes(applied)}.`;
  const left = skipped === 1 ? '1 more fix changes' : `${skipped} more fixes change`;
  return `Applied ${fixes(applied)}. ${left} the same segments: press “Apply all fixes” again to apply ${skipped === 1 ? 'it' : 'them'}.`;
}

/** The details of a segment the inspector edits besides its kind, exercise and times. */
export interface SegmentDetails {
  title?: string | null;
  round?: number | null;
  set?: number | null;
  side?: SegmentSide | null;
}

/**
 * `seg` with `details` applied and checked by the segment schema, so the editor refuses what a
 * save would refuse (a round of 0, a title on two lines) with the schema's own message.
 */
export function withDetails(seg: Segment, details: SegmentDetails): { ok: true; segment: Segment } | { ok: false; message: string } {
  const next: Record<string, unknown> = { ...seg };
  for (const [key, value] of Object.entries(details) as [keyof SegmentDetails, unknown][]) {
    if (value === undefined) continue;
    const blank = value === null || (typeof value === 'string' && value.trim() === '');
    if (blank) delete next[key];
    else next[key] = typeof value === 'string' ? value.trim() : value;
  }
  const parsed = segmentSchema.safeParse(next);
  if (!parsed.success) return { ok: false, message: parsed.error.issues[0]?.message ?? 'That value cannot be saved.' };
  return { ok: true, segment: parsed.data };
}
