// Moving a whole segment in the timeline editor. Timelines here are invented test inputs; the
// expected times are worked by hand in the comments.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { moveSegment, moveTargets, snapSegmentStart } from '~/lib/editor/segment-move';
import { editorReducer, initialEditorState, MIN_SEGMENT_SECONDS } from '~/lib/editor/editor-state';
import { commandForKey, SHORTCUTS } from '~/lib/editor/shortcuts';
import type { Segment, Timeline } from '~/lib/timeline/timeline-schema';

const seg = (id: string, startSeconds: number, endSeconds: number, kind: Segment['kind'] = 'work'): Segment => ({ id, kind, startSeconds, endSeconds });
const tl = (...segments: Segment[]): Timeline => ({ segments, cues: [{ id: 'q1', atSeconds: 5, kind: 'note', text: 'Stays put' }] });
const times = (t: Timeline) => Object.fromEntries(t.segments.map((s) => [s.id, [s.startSeconds, s.endSeconds]]));

describe('moveSegment', () => {
  it('moves both edges by the same amount in free room', () => {
    // a 10–20 in a gap between 0–5 and 30–40: to 12 → 12–22.
    const r = moveSegment(tl(seg('x', 0, 5), seg('a', 10, 20), seg('y', 30, 40)), 'a', 12, 60);
    expect(r.ok && times(r.timeline)).toEqual({ x: [0, 5], a: [12, 22], y: [30, 40] });
    expect(r.ok && r.clamped).toBe(false);
  });

  it('stops at a segment it does not touch instead of overlapping it (clamped)', () => {
    // a is 10 s long; y starts at 30, so a can start at 20 at most; x ends at 5, so at least 5.
    const t = tl(seg('x', 0, 5), seg('a', 10, 20), seg('y', 30, 40));
    const later = moveSegment(t, 'a', 27, 60);
    expect(later.ok && times(later.timeline).a).toEqual([20, 30]);
    expect(later.ok && later.clamped).toBe(true);
    const earlier = moveSegment(t, 'a', 1, 60);
    expect(earlier.ok && times(earlier.timeline).a).toEqual([5, 15]);
  });

  it('neighbours that share an edge follow it and keep at least a tenth of a second', () => {
    // r1 0–10 | w 10–20 | r2 20–30: w to 13 → r1 0–13, w 13–23, r2 23–30.
    const t = tl(seg('r1', 0, 10, 'rest'), seg('w', 10, 20), seg('r2', 20, 30, 'rest'));
    const r = moveSegment(t, 'w', 13, 60);
    expect(r.ok && times(r.timeline)).toEqual({ r1: [0, 13], w: [13, 23], r2: [23, 30] });
    // As far as r2 allows: r2 must keep 0.1 s, so w ends at 29.9 and starts at 19.9.
    const far = moveSegment(t, 'w', 50, 60);
    expect(far.ok && times(far.timeline)).toEqual({ r1: [0, 19.9], w: [19.9, 29.9], r2: [29.9, 30] });
  });

  it('clamps to the recording and refuses a move with no room, saying why', () => {
    const t = tl(seg('a', 50, 60));
    expect(moveSegment(t, 'a', 55, 60)).toEqual({ ok: false, message: expect.stringMatching(/no room to move this segment later/) });
    const back = moveSegment(t, 'a', -3, 60);
    expect(back.ok && times(back.timeline).a).toEqual([0, 10]);
    const boxed = tl(seg('x', 0, 10), seg('a', 10, 20), seg('y', 20, 20.1));
    expect(moveSegment(boxed, 'a', 10.5, 60).ok).toBe(false);
    expect(moveSegment(t, 'missing', 3, 60)).toEqual({ ok: false, message: 'Select a segment first, then move it.' });
  });

  it('leaves a segment it already overlapped (an imported overlap) alone', () => {
    const t = tl(seg('a', 10, 20), seg('o', 15, 25), seg('y', 40, 50));
    const r = moveSegment(t, 'a', 18, 60);
    expect(r.ok && times(r.timeline)).toEqual({ a: [18, 28], o: [15, 25], y: [40, 50] });
  });

  // Random timelines of non-overlapping segments (invented), a random segment and target.
  const arbTimeline = fc
    .array(fc.tuple(fc.integer({ min: 0, max: 30 }), fc.integer({ min: 1, max: 40 })), { minLength: 1, maxLength: 8 })
    .map((parts) => {
      // Gaps (possibly 0: shared edges) and lengths in tenths of a second, laid end to end.
      let at = 0;
      const segments = parts.map(([gap, len], i) => {
        const start = (at + gap) / 10;
        at += gap + len;
        return seg(`s${i}`, start, at / 10);
      });
      return { timeline: tl(...segments), media: at / 10 + 5 };
    });

  it('for any timeline: length kept, inside the recording, no new overlap, only shared-edge neighbours change, cues stay', () => {
    fc.assert(
      fc.property(arbTimeline, fc.nat(), fc.double({ min: -20, max: 120, noNaN: true }), ({ timeline, media }, pick, to) => {
        const target = timeline.segments[pick % timeline.segments.length]!;
        const r = moveSegment(timeline, target.id, to, media);
        if (!r.ok) return;
        const moved = r.timeline.segments.find((s) => s.id === target.id)!;
        expect(moved.endSeconds - moved.startSeconds).toBeCloseTo(target.endSeconds - target.startSeconds, 6);
        expect(moved.startSeconds).toBeGreaterThanOrEqual(0);
        expect(moved.endSeconds).toBeLessThanOrEqual(media + 1e-9);
        expect(r.timeline.cues).toEqual(timeline.cues);
        for (const before of timeline.segments) {
          if (before.id === target.id) continue;
          const after = r.timeline.segments.find((s) => s.id === before.id)!;
          expect(after.endSeconds - after.startSeconds).toBeGreaterThanOrEqual(MIN_SEGMENT_SECONDS - 1e-9);
          // Never overlaps the moved segment (they did not overlap before).
          expect(after.endSeconds <= moved.startSeconds + 1e-9 || after.startSeconds >= moved.endSeconds - 1e-9).toBe(true);
          const sharedStart = Math.abs(before.endSeconds - target.startSeconds) < 0.0005;
          const sharedEnd = Math.abs(before.startSeconds - target.endSeconds) < 0.0005;
          if (!sharedStart && !sharedEnd) expect(after).toEqual(before);
          if (sharedStart) expect(after).toEqual({ ...before, endSeconds: moved.startSeconds });
          if (sharedEnd) expect(after).toEqual({ ...before, startSeconds: moved.endSeconds });
        }
      }),
    );
  });
});

describe('snapping a dropped segment', () => {
  const options = { enabled: true, maxDistance: 0.5 };
  it('the edge nearer a target wins and the other follows at the segment length', () => {
    // 10 s segment dropped at 12.3 (end 22.3): onset 12 is 0.3 away, plan 22.4 is 0.1 away → end snaps: start 12.4.
    expect(snapSegmentStart(12.3, 10, { onsets: [12], planned: [22.4] }, options)).toBeCloseTo(12.4, 9);
    // Only the start has a target in reach.
    expect(snapSegmentStart(12.3, 10, { onsets: [12], planned: [30] }, options)).toBe(12);
    // Nothing in reach, snapping off, or bypassed (Alt held): exactly where it was dropped.
    expect(snapSegmentStart(12.3, 10, { onsets: [5], planned: [] }, options)).toBe(12.3);
    expect(snapSegmentStart(12.3, 10, { onsets: [12], planned: [] }, { ...options, enabled: false })).toBe(12.3);
    expect(snapSegmentStart(12.3, 10, { onsets: [12], planned: [] }, { ...options, bypass: true })).toBe(12.3);
  });
  it('its own edges (and the neighbours’ edges it shares) are no targets', () => {
    const t = tl(seg('r1', 0, 10, 'rest'), seg('w', 10, 20), seg('r2', 20, 30, 'rest'));
    expect(moveTargets(t, 'w', [], []).marks).toEqual([0, 30]);
  });
});

describe('in the editor', () => {
  const start = () => editorReducer(initialEditorState(tl(seg('r1', 0, 10, 'rest'), seg('w', 10, 20), seg('r2', 20, 30, 'rest')), 60), { type: 'select', selection: { type: 'segment', id: 'w', edge: null } });

  it('a key move of the selected segment is one undo step, and undo puts the neighbours back', () => {
    const moved = editorReducer(start(), { type: 'move-segment', delta: 1 });
    expect(times(moved.timeline)).toEqual({ r1: [0, 11], w: [11, 21], r2: [21, 30] });
    expect(moved.past).toHaveLength(1);
    expect(moved.selection).toEqual({ type: 'segment', id: 'w', edge: null });
    const undone = editorReducer(moved, { type: 'undo' });
    expect(times(undone.timeline)).toEqual({ r1: [0, 10], w: [10, 20], r2: [20, 30] });
  });

  it('a drop names the segment and where it starts; a refused move changes nothing and says why', () => {
    const dropped = editorReducer(start(), { type: 'move-segment', segmentId: 'w', to: 4 });
    expect(times(dropped.timeline).w).toEqual([4, 14]);
    const none = editorReducer(initialEditorState(tl(seg('a', 50, 60)), 60), { type: 'move-segment', segmentId: 'a', delta: 1 });
    expect(none.past).toHaveLength(0);
    expect(none.notice).toMatch(/no room to move this segment later/);
    const nothingSelected = editorReducer(initialEditorState(tl(seg('a', 0, 10)), 60), { type: 'move-segment', delta: 1 });
    expect(nothingSelected.notice).toBe('Select a segment first, then move it.');
  });

  it('Ctrl (or ⌘) with the arrows moves the segment, with Shift by a second; the keys help lists them', () => {
    const key = (k: string, mods: Partial<{ ctrlKey: boolean; metaKey: boolean; shiftKey: boolean }>) =>
      commandForKey({ key: k, ctrlKey: false, metaKey: false, shiftKey: false, altKey: false, ...mods })?.command;
    expect(key('ArrowLeft', { ctrlKey: true })).toBe('move-small-back');
    expect(key('ArrowRight', { metaKey: true })).toBe('move-small-forward');
    expect(key('ArrowLeft', { ctrlKey: true, shiftKey: true })).toBe('move-large-back');
    expect(key('ArrowRight', { ctrlKey: true, shiftKey: true })).toBe('move-large-forward');
    expect(key('ArrowRight', {})).toBe('nudge-small-forward');
    expect(SHORTCUTS.filter((s) => s.command.startsWith('move-')).map((s) => s.keys)).toEqual([
      'Ctrl + ← (⌘ + ← on a Mac)',
      'Ctrl + → (⌘ + → on a Mac)',
      'Ctrl + Shift + ←',
      'Ctrl + Shift + →',
    ]);
  });
});
