import { describe, expect, it } from 'vitest';
import { editorReducer, initialEditorState, type EditorAction, type EditorState } from '~/lib/editor/editor-state';
import { appliedFixesNotice } from '~/lib/editor/editor-state';
import { planSchema } from '~/lib/plan/plan-schema';
import { expandPlan } from '~/lib/plan/expand-plan';
import { checkTiming } from '~/lib/timing/timing-check';
import type { Timeline } from '~/lib/timeline/timeline-schema';
import { diffTimelines } from '~/lib/editor/timeline-diff';
import { commandForKey, SHORTCUTS } from '~/lib/editor/shortcuts';
import { clearDraft, readDraft, writeDraft } from '~/lib/editor/local-draft';

// Tabata protocol: 8 × (20 s work + 10 s rest) = 240 s (Tabata et al., Med Sci Sports Exerc 1996;28(10):1327–1330).
const tabata = planSchema.parse({
  blocks: [{ kind: 'intervals', exercise: 'Fast feet', sets: 8, workSeconds: 20, restSeconds: 10 }],
  options: { dropFinalRest: false },
});

const seg = (id: string, kind: 'work' | 'rest' | 'talk', start: number, end: number, exercise?: string) => ({
  id, kind, startSeconds: start, endSeconds: end, ...(exercise ? { exercise } : {}),
});
const base: Timeline = {
  segments: [seg('a', 'work', 10, 30, 'Fast feet'), seg('b', 'rest', 30, 40, 'Fast feet'), seg('c', 'work', 40, 60, 'Fast feet')],
  cues: [{ id: 'q1', atSeconds: 37, kind: 'countdown', text: '3, 2, 1' }],
};
const run = (actions: EditorAction[], state: EditorState = initialEditorState(base, 300)) => actions.reduce(editorReducer, state);
const find = (s: EditorState, id: string) => s.timeline.segments.find((x) => x.id === id)!;

describe('editor state', () => {
  it('splits the segment under the playhead into two with the same kind and exercise', () => {
    const s = run([{ type: 'split', at: 20 }]);
    expect(s.timeline.segments).toHaveLength(4);
    expect(find(s, 'a')).toMatchObject({ startSeconds: 10, endSeconds: 20 });
    const second = s.timeline.segments.find((x) => x.startSeconds === 20)!;
    expect(second).toMatchObject({ kind: 'work', exercise: 'Fast feet', endSeconds: 30 });
    expect(s.selection).toEqual({ type: 'segment', id: second.id, edge: 'start' });
  });

  it('starts a new segment up to the next mark when nothing is marked at the playhead', () => {
    const s = run([{ type: 'split', at: 2 }]);
    expect(s.timeline.segments[0]).toMatchObject({ startSeconds: 2, endSeconds: 10, kind: 'talk' });
  });

  it('sets the kind and exercise of the selected segment; non-work kinds drop the exercise', () => {
    let s = run([{ type: 'select', selection: { type: 'segment', id: 'a', edge: null } }, { type: 'set-exercise', exercise: ' High knees ' }]);
    expect(find(s, 'a').exercise).toBe('High knees');
    s = editorReducer(s, { type: 'set-kind', kind: 'talk' });
    expect(find(s, 'a')).not.toHaveProperty('exercise');
    expect(find(s, 'a').kind).toBe('talk');
  });

  it('edits title, round, set and side of the selected segment in one undoable step each; blank takes a field away', () => {
    const select: EditorAction = { type: 'select', selection: { type: 'segment', id: 'a', edge: null } };
    let s = run([select, { type: 'set-details', details: { title: ' Opening move ', round: 2, set: 3, side: 'left' } }]);
    expect(find(s, 'a')).toMatchObject({ title: 'Opening move', round: 2, set: 3, side: 'left', exercise: 'Fast feet' });
    s = editorReducer(s, { type: 'set-details', details: { title: '', side: null, set: null } });
    expect(find(s, 'a')).not.toHaveProperty('title');
    expect(find(s, 'a')).not.toHaveProperty('side');
    expect(find(s, 'a')).not.toHaveProperty('set');
    expect(find(s, 'a').round).toBe(2);
    s = editorReducer(s, { type: 'undo' });
    expect(find(s, 'a').side).toBe('left');
  });

  it('refuses a round of 0 with the schema\'s message and changes nothing', () => {
    const s = run([{ type: 'select', selection: { type: 'segment', id: 'a', edge: null } }, { type: 'set-details', details: { round: 0 } }]);
    expect(find(s, 'a')).not.toHaveProperty('round');
    expect(s.notice).toBe('The round starts at 1.');
  });

  it('nudges the selected boundary by 0.1 s and 1 s, moving a shared boundary on both sides', () => {
    const s = run([
      { type: 'select', selection: { type: 'segment', id: 'b', edge: 'start' } },
      { type: 'nudge', delta: 0.1 },
      { type: 'nudge', delta: 0.1 },
      { type: 'nudge', delta: 1 },
    ]);
    expect(find(s, 'b').startSeconds).toBe(31.2);
    expect(find(s, 'a').endSeconds).toBe(31.2); // the neighbour's end moved with it, no float noise
    expect(s.past).toHaveLength(3);
  });

  it('nudges a selected cue and keeps every segment at least 0.1 s long', () => {
    let s = run([{ type: 'select', selection: { type: 'cue', id: 'q1' } }, { type: 'nudge', delta: -1 }]);
    expect(s.timeline.cues[0]!.atSeconds).toBe(36);
    s = run([{ type: 'move-edge', segmentId: 'b', edge: 'end', to: 5 }]);
    expect(find(s, 'b').endSeconds).toBe(30.1);
  });

  it('jumps to the next and previous boundary and selects it', () => {
    let s = run([{ type: 'select-boundary', from: 12, direction: 1 }]);
    expect(s.selection).toEqual({ type: 'segment', id: 'b', edge: 'start' });
    s = editorReducer(s, { type: 'select-boundary', from: 61, direction: -1 });
    expect(s.selection).toEqual({ type: 'segment', id: 'c', edge: 'end' });
  });

  it('adds a cue at the playhead, deletes it, and joins two segments when a boundary is deleted', () => {
    let s = run([{ type: 'add-cue', at: 12.34 }]);
    expect(s.timeline.cues.map((c) => c.atSeconds)).toEqual([12.34, 37]);
    s = editorReducer(s, { type: 'delete' });
    expect(s.timeline.cues).toHaveLength(1);
    s = run([{ type: 'select', selection: { type: 'segment', id: 'b', edge: 'start' } }, { type: 'delete' }]);
    expect(s.timeline.segments.map((x) => x.id)).toEqual(['a', 'c']);
    expect(find(s, 'a').endSeconds).toBe(40);
  });

  it('undoes and redoes without limit, and a new change clears redo', () => {
    const actions: EditorAction[] = [{ type: 'select', selection: { type: 'segment', id: 'c', edge: 'end' } }];
    for (let i = 0; i < 250; i++) actions.push({ type: 'nudge', delta: 0.1 });
    let s = run(actions);
    expect(find(s, 'c').endSeconds).toBe(85);
    for (let i = 0; i < 250; i++) s = editorReducer(s, { type: 'undo' });
    expect(s.timeline).toEqual(initialEditorState(base, 300).timeline);
    expect(editorReducer(s, { type: 'undo' }).notice).toBe('Nothing to undo.');
    s = editorReducer(editorReducer(s, { type: 'redo' }), { type: 'redo' });
    expect(find(s, 'c').endSeconds).toBe(60.2);
    s = editorReducer(s, { type: 'split', at: 45 });
    expect(s.future).toEqual([]);
  });

  it('lays the plan out from the playhead with planned lengths and names, replacing overlapped marks', () => {
    const s = run([{ type: 'layout-from-plan', plan: tabata, at: 5 }]);
    const expected = expandPlan(tabata, 5).segments;
    expect(s.timeline.segments).toHaveLength(expected.length);
    expect(s.timeline.segments.map((x) => [x.kind, x.startSeconds, x.endSeconds, x.exercise, x.set])).toEqual(
      expected.map((p) => [p.kind, p.startSeconds, p.startSeconds + p.seconds, 'Fast feet', p.set]),
    );
    expect(s.timeline.segments.at(-1)!.endSeconds - 5).toBe(240); // Tabata: 240 s
    expect(s.timeline.cues).toEqual(base.cues);
    expect(checkTiming(tabata, s.timeline).findings.filter((f) => f.severity === 'error')).toEqual([]);
    expect(editorReducer(s, { type: 'undo' }).timeline).toEqual(initialEditorState(base, 300).timeline);
  });

  it('applies one suggested fix, then all non-conflicting ones, until the check has no errors', () => {
    const laid = run([{ type: 'layout-from-plan', plan: tabata, at: 0 }]);
    // Break two work intervals: one 9 s long, one that starts 2 s early.
    const broken = laid.timeline.segments.map((x, i) => (i === 0 ? { ...x, endSeconds: 9 } : i === 4 ? { ...x, startSeconds: x.startSeconds - 2 } : x));
    let s = editorReducer(laid, { type: 'replace', timeline: { segments: broken, cues: [] } });
    const findings = checkTiming(tabata, s.timeline).findings;
    const short = findings.find((f) => f.code === 'work-too-short')!;
    s = editorReducer(s, { type: 'apply-fix', finding: short });
    expect(s.timeline.segments[0]!.endSeconds).toBe(20);
    expect(s.notice).toBe('Fix applied.');
    s = editorReducer(s, { type: 'apply-fixes', findings: checkTiming(tabata, s.timeline).findings });
    expect(checkTiming(tabata, s.timeline).ok).toBe(true);
    expect(s.past).toHaveLength(2);
  });
});

describe('timeline diff for the save conflict', () => {
  it('lists changed, added and removed marks in words', () => {
    const theirs: Timeline = { segments: [{ ...base.segments[0]!, startSeconds: 11 }, base.segments[1]!], cues: [...base.cues, { id: 'q9', atSeconds: 50, kind: 'form', text: 'Chest up' }] };
    const d = diffTimelines(base, theirs);
    expect(d.map((x) => [x.id, x.change])).toEqual([['a', 'changed'], ['c', 'only-mine'], ['q9', 'only-theirs']]);
    expect(d[0]).toMatchObject({ mine: 'Work "Fast feet" 0:10.0–0:30.0', theirs: 'Work "Fast feet" 0:11.0–0:30.0' });
  });

  it('counts a changed side or format as a change, in words', () => {
    const theirs: Timeline = { ...base, segments: [{ ...base.segments[0]!, side: 'left' }, { ...base.segments[1]!, format: 'amrap' }] };
    const d = diffTimelines(base, theirs);
    expect(d.filter((x) => x.kind === 'segment').map((x) => [x.id, x.change])).toEqual([['a', 'changed'], ['b', 'changed'], ['c', 'only-mine']]);
    expect(d[0]).toMatchObject({ mine: 'Work "Fast feet" 0:10.0–0:30.0', theirs: 'Work "Fast feet" left side 0:10.0–0:30.0' });
  });
});

describe('keyboard map', () => {
  const key = (k: string, mods: Partial<{ shiftKey: boolean; ctrlKey: boolean; metaKey: boolean; altKey: boolean }> = {}) =>
    commandForKey({ key: k, shiftKey: false, ctrlKey: false, metaKey: false, altKey: false, ...mods });
  it.each([
    [' ', {}, 'play-pause'], ['s', {}, 'split'], ['ArrowLeft', {}, 'nudge-small-back'], ['ArrowRight', { shiftKey: true }, 'nudge-large-forward'],
    [']', {}, 'next-boundary'], ['c', {}, 'add-cue'], ['z', { ctrlKey: true }, 'undo'], ['Z', { ctrlKey: true, shiftKey: true }, 'redo'],
    ['s', { metaKey: true }, 'save'], ['?', {}, 'help'], ['l', {}, 'layout'],
  ] as const)('%j with %j means %s', (k, mods, command) => expect(key(k, mods)?.command).toBe(command));
  it('maps digits to kinds and documents every command in the help table', () => {
    expect(key('3')).toEqual({ command: 'kind', index: 2 });
    expect(key('9')).toBeNull();
    const commands = new Set(SHORTCUTS.map((s) => s.command));
    for (const k of [' ', 's', '1', 'e', 'ArrowLeft', '[', ']', 'c', 'Delete', 'l', 'n', '+', '-', '?']) expect(commands.has(key(k)!.command)).toBe(true);
  });
});

describe('local draft', () => {
  it('writes, reads and clears a draft, and ignores one that is not a timeline', () => {
    const store = new Map<string, string>();
    const storage = { getItem: (k: string) => store.get(k) ?? null, setItem: (k: string, v: string) => void store.set(k, v), removeItem: (k: string) => void store.delete(k) };
    writeDraft(storage, 'L1', { baseVersion: 3, savedAt: '2026-01-01T10:00:00.000Z', timeline: base });
    expect(readDraft(storage, 'L1')).toEqual({ baseVersion: 3, savedAt: '2026-01-01T10:00:00.000Z', timeline: base });
    store.set('roundmark:timeline-draft:L2', '{"baseVersion":1,"timeline":{"segments":[{"id":"x"}]}}');
    expect(readDraft(storage, 'L2')).toBeNull();
    clearDraft(storage, 'L1');
    expect(readDraft(storage, 'L1')).toBeNull();
  });
});

describe('the "Apply all fixes" notice', () => {
  it.each([
    [1, 0, 'Applied 1 fix.'],
    [3, 0, 'Applied 3 fixes.'],
    [1, 1, 'Applied 1 fix. 1 more fix changes the same segments: press “Apply all fixes” again to apply it.'],
    [2, 3, 'Applied 2 fixes. 3 more fixes change the same segments: press “Apply all fixes” again to apply them.'],
  ])('%i applied, %i left', (applied, skipped, text) => {
    expect(appliedFixesNotice(applied, skipped)).toBe(text);
  });
});
