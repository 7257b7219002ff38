import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { leaveStationOut } from '~/lib/plan/leave-out';
import { editorReducer, initialEditorState, insertSegment } from '~/lib/editor/editor-state';
import { checkTiming } from '~/lib/timing/timing-check';
import { plan, timelineFromPlan, without } from './timing-fixtures';

// Invented: warm-up 60 s, circuit A/B/C × (40 s work + 20 s rest) × 2 rounds with a 30 s break.
const circuit = plan({
  blocks: [
    { kind: 'warmup', seconds: 60 },
    { kind: 'circuit', rounds: 2, roundBreakSeconds: 30, stations: ['A', 'B', 'C'].map((exercise) => ({ exercise, workSeconds: 40, restSeconds: 20 })) },
  ],
});

/** The marks of a class that skipped B in round 2: B's work and rest gone, later marks moved up. */
function skippedB() {
  const t = timelineFromPlan(circuit);
  const b = t.segments.find((s) => s.kind === 'work' && s.exercise === 'B' && s.round === 2)!;
  const rest = t.segments[t.segments.indexOf(b) + 1]!;
  const hole = rest.endSeconds - b.startSeconds;
  const cut = without(t, b.id, rest.id);
  return { ...cut, segments: cut.segments.map((s) => (s.startSeconds >= rest.endSeconds ? { ...s, startSeconds: s.startSeconds - hole, endSeconds: s.endSeconds - hole } : s)) };
}

describe('a missing station', () => {
  it('is reported with what is missing, so the editor can act on it', () => {
    const result = checkTiming(circuit, skippedB(), { mediaSeconds: 1000 });
    const finding = result.findings.find((f) => f.code === 'missing-station');
    expect(finding?.missing).toEqual({ blockIndex: 1, stationIndex: 1, round: 2, exercise: 'B', seconds: 40 });
  });

  it('"Leave it out of this class": the plan skips it and the check passes', () => {
    const out = leaveStationOut(circuit, 1, 2, 1);
    expect(out.ok).toBe(true);
    if (!out.ok) return;
    const block = out.plan.blocks[1]!;
    expect(block.kind === 'circuit' && block.roundChanges).toEqual([{ round: 2, skipStations: [2] }]);
    expect(checkTiming(out.plan, skippedB(), { mediaSeconds: 1000 }).findings).toEqual([]);
    // Twice is the same as once; a second station joins the same round's change.
    const again = leaveStationOut(out.plan, 1, 2, 1);
    expect(again.ok && again.plan).toEqual(out.plan);
    const both = leaveStationOut(out.plan, 1, 2, 0);
    expect(both.ok && both.plan.blocks[1]!.kind === 'circuit' && both.plan.blocks[1]!.roundChanges).toEqual([{ round: 2, skipStations: [1, 2] }]);
  });

  it('refuses to leave out the last station of a round, or a station of a non-circuit', () => {
    const two = leaveStationOut(circuit, 1, 2, 0);
    const three = two.ok ? leaveStationOut(two.plan, 1, 2, 1) : two;
    const all = three.ok ? leaveStationOut(three.plan, 1, 2, 2) : three;
    expect(all).toEqual({ ok: false, message: 'Round 2 cannot leave out every station; lower the number of rounds instead.' });
    expect(leaveStationOut(circuit, 0, 1, 0)).toEqual({ ok: false, message: 'Only a circuit station can be left out of a round.' });
  });

  it('"Mark it here": a work interval of the planned length at the playhead, undoable', () => {
    const state = initialEditorState({ segments: [], cues: [] }, 600);
    const next = editorReducer(state, { type: 'insert-segment', segment: { kind: 'work', startSeconds: 100, endSeconds: 140, exercise: 'B', round: 2 } });
    expect(next.timeline.segments).toEqual([{ id: expect.any(String), kind: 'work', startSeconds: 100, endSeconds: 140, exercise: 'B', round: 2 }]);
    expect(next.selection).toMatchObject({ type: 'segment' });
    expect(editorReducer(next, { type: 'undo' }).timeline.segments).toEqual([]);
  });
});

describe('insertSegment', () => {
  it('trims, splits and drops what it covers, and leaves no overlap with the new segment', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: 0, max: 500 }), fc.integer({ min: 1, max: 100 })), { maxLength: 12 }),
        fc.integer({ min: 0, max: 550 }),
        fc.integer({ min: 1, max: 120 }),
        (spans, start, length) => {
          const t = { segments: spans.map(([s, l], i) => ({ id: `s${i}`, kind: 'talk' as const, startSeconds: s, endSeconds: s + l })), cues: [] };
          const { timeline, id } = insertSegment(t, { kind: 'work', startSeconds: start, endSeconds: start + length }, 1000);
          const added = timeline.segments.find((s) => s.id === id)!;
          expect([added.startSeconds, added.endSeconds]).toEqual([start, start + length]);
          for (const s of timeline.segments) {
            if (s.id === id) continue;
            expect(s.endSeconds <= start + 0.0005 || s.startSeconds >= start + length - 0.0005).toBe(true);
            expect(s.endSeconds - s.startSeconds).toBeGreaterThan(0);
          }
          expect(new Set(timeline.segments.map((s) => s.id)).size).toBe(timeline.segments.length);
        },
      ),
    );
  });

  it('splits a segment it falls inside into two pieces around it', () => {
    const t = { segments: [{ id: 'a', kind: 'talk' as const, startSeconds: 0, endSeconds: 100 }], cues: [] };
    const { timeline } = insertSegment(t, { kind: 'work', startSeconds: 40, endSeconds: 60 });
    expect(timeline.segments.map((s) => [s.kind, s.startSeconds, s.endSeconds])).toEqual([['talk', 0, 40], ['talk', 60, 100], ['work', 40, 60]]);
  });
});

