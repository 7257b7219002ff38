import { describe, expect, it } from 'vitest';
import type { Cue, Timeline } from '~/lib/timeline/timeline-schema';
import { FINDING_CODES } from '~/lib/timing/finding-types';
import { checkTiming } from '~/lib/timing/timing-check';
import { codes, edit, plan, smallCircuit, timelineFromPlan, without } from './timing-fixtures';

// Schedule of smallCircuit() worked out by hand (see timing-fixtures.ts):
// s0 warm-up 0–60 | s1 A 60–100 | s2 rest 100–120 | s3 B 120–160 | s4 rest 160–180 | s5 C 180–220 |
// s6 break 220–250 | s7 A 250–290 | s8 rest 290–310 | s9 B 310–350 | s10 rest 350–370 | s11 C 370–410 |
// s12 cool-down 410–470
const P = smallCircuit();
const base = (): Timeline => timelineFromPlan(P);

/** Moves the boundary between two back-to-back segments. */
const moveBoundary = (t: Timeline, left: string, right: string, at: number): Timeline =>
  edit(edit(t, left, { endSeconds: at }), right, { startSeconds: at });

/** Lengthens segment `index` by `d` seconds and shifts every later one, so nothing else changes length. */
const stretch = (t: Timeline, index: number, d: number): Timeline => ({
  ...t,
  segments: t.segments.map((s, i) =>
    i > index ? { ...s, startSeconds: s.startSeconds + d, endSeconds: s.endSeconds + d } : i === index ? { ...s, endSeconds: s.endSeconds + d } : s,
  ),
});

const cue = (atSeconds: number, kind: Cue['kind'] = 'note'): Cue => ({ id: `c${atSeconds}`, atSeconds, kind, text: 'Keep the chest up' });

describe('the hand-worked schedule', () => {
  it('is what the fixtures produce', () => {
    expect(base().segments.map((s) => [s.startSeconds, s.endSeconds])).toEqual([
      [0, 60], [60, 100], [100, 120], [120, 160], [160, 180], [180, 220], [220, 250],
      [250, 290], [290, 310], [310, 350], [350, 370], [370, 410], [410, 470],
    ]);
  });
  it('a timeline marking the plan exactly has no finding', () => {
    const r = checkTiming(P, base(), { mediaSeconds: 470, advertisedMinutes: 8 });
    expect(r.findings).toEqual([]);
    expect(r.ok).toBe(true);
  });
});

// Tolerances are the defaults: work ±2 s, rest ±5 s, blocks ±15 s, gap 3 s, advertised ±10 %.
// Each row: at the edge nothing is reported; one millisecond beyond, exactly that finding.
describe.each<[string, (t: Timeline) => Timeline, (t: Timeline) => Timeline, string[]]>([
  ['work-too-long', (t) => moveBoundary(t, 's1', 's2', 102), (t) => moveBoundary(t, 's1', 's2', 102.001), ['work-too-long']],
  ['work-too-short', (t) => moveBoundary(t, 's1', 's2', 98), (t) => moveBoundary(t, 's1', 's2', 97.999), ['work-too-short']],
  ['rest-too-long', (t) => stretch(t, 2, 5), (t) => stretch(t, 2, 5.001), ['rest-too-long']],
  ['rest-too-short', (t) => stretch(t, 2, -5), (t) => stretch(t, 2, -5.001), ['rest-too-short']],
  ['rest-too-long (round break)', (t) => stretch(t, 6, 5), (t) => stretch(t, 6, 5.001), ['rest-too-long']],
  ['block-length (warm-up)', (t) => stretch(t, 0, 15), (t) => stretch(t, 0, 15.001), ['block-length']],
  ['block-length (cool-down)', (t) => edit(t, 's12', { endSeconds: 455 }), (t) => edit(t, 's12', { endSeconds: 454.999 }), ['block-length']],
  ['gap', (t) => edit(t, 's2', { endSeconds: 117 }), (t) => edit(t, 's2', { endSeconds: 116.999 }), ['gap']],
  ['overlap', (t) => t, (t) => edit(t, 's3', { startSeconds: 119.999 }), ['overlap']],
])('%s', (_name, atEdge, beyond, expected) => {
  it('nothing at the tolerance edge', () => {
    expect(checkTiming(P, atEdge(base())).findings).toEqual([]);
  });
  it('exactly the matching finding beyond it', () => {
    expect(codes(checkTiming(P, beyond(base())).findings)).toEqual(expected);
  });
});

describe('outside-media', () => {
  it('reports a segment ending after the recording, with a fix ending it there', () => {
    expect(checkTiming(P, base(), { mediaSeconds: 470 }).findings).toEqual([]);
    const r = checkTiming(P, base(), { mediaSeconds: 469.999 });
    expect(codes(r.findings)).toEqual(['outside-media']);
    expect(r.findings[0]).toMatchObject({ severity: 'error', segmentIds: ['s12'], fix: { segmentId: 's12', field: 'endSeconds', value: 469.999 } });
    expect(r.ok).toBe(false);
  });
});

describe('length-vs-advertised (±10 % house rule)', () => {
  const talk = plan({ blocks: [{ kind: 'talk', seconds: 660 }] });
  const t = (end: number): Timeline => ({ segments: [{ id: 't', kind: 'talk', startSeconds: 0, endSeconds: end }], cues: [] });
  it('11:00 against 10 minutes is exactly at the 10 % edge', () => {
    expect(checkTiming(talk, t(660), { advertisedMinutes: 10 }).findings).toEqual([]);
  });
  it('one millisecond more is reported as a warning, and the class still passes', () => {
    // the talk block tolerance is 15 s, so 660.001 is no block-length finding
    const r = checkTiming(talk, t(660.001), { advertisedMinutes: 10 });
    expect(codes(r.findings)).toEqual(['length-vs-advertised']);
    expect(r.ok).toBe(true);
    expect(r.totals.classVsAdvertisedSeconds).toBe(60.001);
  });
  it('uses the plan length when nothing is marked yet', () => {
    const r = checkTiming(talk, { segments: [], cues: [] }, { advertisedMinutes: 25 });
    expect(r.findings.map((f) => f.code)).toContain('length-vs-advertised');
  });
});

describe('stations', () => {
  it('missing-station: a station left out does not flag the later ones', () => {
    // B of round 2 and its rest not marked: 60 s unmarked between 5:10 and 6:10
    const r = checkTiming(P, without(base(), 's9', 's10'));
    expect(codes(r.findings)).toEqual(['gap', 'missing-station']);
    const missing = r.findings.find((f) => f.code === 'missing-station')!;
    expect(missing).toMatchObject({ severity: 'error', atSeconds: 310 });
    expect(missing.message).toContain('B (round 2, station 2)');
    expect(r.ok).toBe(false);
  });
  it('unexpected-station: an extra work interval after the class', () => {
    const t = base();
    t.segments.push({ id: 'x', kind: 'work', startSeconds: 470, endSeconds: 500, exercise: 'Burpee' });
    const r = checkTiming(P, t);
    expect(codes(r.findings)).toEqual(['unexpected-station']);
    expect(r.findings[0]).toMatchObject({ severity: 'warning', segmentIds: ['x'] });
  });
  it('unexpected-station: a mark named differently from the station planned there', () => {
    const r = checkTiming(P, edit(base(), 's3', { exercise: 'Lunge' }));
    expect(codes(r.findings)).toEqual(['unexpected-station']);
    expect(r.findings[0]!.message).toContain('B (round 1, station 2)');
  });
  it('out-of-order: two stations swapped give one finding, not a cascade', () => {
    const r = checkTiming(P, edit(edit(base(), 's1', { exercise: 'B' }), 's3', { exercise: 'A' }));
    expect(codes(r.findings)).toEqual(['out-of-order']);
  });
  it('names compare without case or extra spaces, and an unnamed mark matches any station', () => {
    expect(checkTiming(P, edit(edit(base(), 's1', { exercise: '  a ' }), 's3', { exercise: undefined })).findings).toEqual([]);
  });
  it('round-count: a whole round left out is one finding', () => {
    const t = without(base(), 's6', 's7', 's8', 's9', 's10', 's11');
    const moved = edit(t, 's12', { startSeconds: 220, endSeconds: 280 });
    const r = checkTiming(P, moved);
    expect(codes(r.findings)).toEqual(['round-count']);
    expect(r.findings[0]!.message).toContain('2 rounds');
  });
  it('round-count: an extra round is reported too', () => {
    const three = plan({ ...P, blocks: P.blocks.map((b) => (b.kind === 'circuit' ? { ...b, rounds: 3 } : b)) });
    const r = checkTiming(P, timelineFromPlan(three));
    expect(r.findings.map((f) => f.code)).toContain('round-count');
    expect(r.findings.filter((f) => f.code === 'unexpected-station')).toHaveLength(3);
  });
  it('intervals with every set missing: round-count', () => {
    const p = plan({ blocks: [{ kind: 'intervals', exercise: 'Fast feet', sets: 8, workSeconds: 20, restSeconds: 10 }] });
    expect(codes(checkTiming(p, { segments: [], cues: [] }).findings)).toEqual(['round-count']);
  });
  it('block-length: a planned warm-up not marked, and a talk not in the plan', () => {
    const t = edit(base(), 's0', { kind: 'talk' });
    expect(codes(checkTiming(P, t).findings)).toEqual(['block-length', 'block-length']);
  });
});

describe('cues', () => {
  it.each([
    [470, []],
    [470.001, ['cue-outside-segment']],
    [0, []],
  ])('cue-outside-segment: a note at %s s', (at, expected) => {
    expect(codes(checkTiming(P, { ...base(), cues: [cue(at)] }).findings)).toEqual(expected);
  });
  it('cue-outside-segment: a note in an unmarked gap', () => {
    const t = { ...edit(base(), 's2', { endSeconds: 110 }), cues: [cue(115)] };
    expect(codes(checkTiming(P, t).findings)).toEqual(['cue-outside-segment', 'gap', 'rest-too-short'].sort());
  });
  it.each([
    [57, []], // in the warm-up, leading into A at 60
    [60, []], // exactly at the start of work
    [60.001, ['countdown-late']],
    [79.999, ['countdown-late']], // still nearer the start of 60–100
    [85, []], // counting down the end of work
  ])('countdown at %s s', (at, expected) => {
    const r = checkTiming(P, { ...base(), cues: [cue(at, 'countdown')] });
    expect(codes(r.findings)).toEqual(expected);
    if (expected.length > 0) expect(r.findings[0]).toMatchObject({ segmentIds: ['s1'], cueIds: [`c${at}`] });
  });
  it('a form cue inside work is never late', () => {
    expect(checkTiming(P, { ...base(), cues: [cue(61, 'form')] }).findings).toEqual([]);
  });
});

describe('emom-minute', () => {
  // EMOM as the trade defines it (common practice, no source): work starts on each whole minute.
  // 3 minutes of 30 s work: tops at 0, 60 and 120 s; minute 2's work marked from 63 s is 3 s late.
  const emom = plan({ blocks: [{ kind: 'emom', minutes: 3, workSeconds: 30, exercises: ['Burpee'] }] });
  it('a minute whose work does not start on the minute is reported, with a fix back to the top', () => {
    const t = moveBoundary(timelineFromPlan(emom), 's1', 's2', 63);
    const r = checkTiming(emom, t);
    expect(codes(r.findings)).toEqual(['emom-minute']);
    expect(r.findings[0]!.fix).toEqual([
      { segmentId: 's1', field: 'endSeconds', value: 60 },
      { segmentId: 's2', field: 'startSeconds', value: 60 },
    ]);
  });
});

describe('findings', () => {
  it('every code of the public list is covered by this file', () => {
    // Guard: if a code is added to the list, a test above must be added too.
    expect(FINDING_CODES).toHaveLength(16);
  });
  it('are ordered by time, then severity, then code', () => {
    const t = edit(moveBoundary(base(), 's1', 's2', 110), 's12', { endSeconds: 480 });
    const r = checkTiming(P, { ...t, cues: [cue(70, 'countdown')] }, { mediaSeconds: 475, advertisedMinutes: 5 });
    const keys = r.findings.map((f) => [f.atSeconds, { error: 0, warning: 1, info: 2 }[f.severity], f.code] as const);
    const sorted = [...keys].sort((a, b) => a[0] - b[0] || a[1] - b[1] || (a[2] < b[2] ? -1 : a[2] > b[2] ? 1 : 0));
    expect(keys).toEqual(sorted);
    expect(r.findings.length).toBeGreaterThan(3);
  });
  it('messages use the design brief time format and say what to do', () => {
    const r = checkTiming(P, moveBoundary(base(), 's1', 's2', 69));
    const f = r.findings.find((x) => x.code === 'work-too-short')!;
    expect(f.message).toBe(
      'The work "A" at 1:00.0 lasts 9 s; the plan has 40 s for A (round 1, station 1) (±2 s). The suggested fix makes it 40 s.',
    );
  });
});

describe('totals', () => {
  it('report marked against planned per kind, block and round', () => {
    const r = checkTiming(P, moveBoundary(base(), 's7', 's8', 293), { advertisedMinutes: 8, mediaSeconds: 600 });
    // by hand: work 6 × 40 = 240 planned; marked +3 s on A of round 2
    expect(r.totals.planned).toMatchObject({ workSeconds: 240, restSeconds: 80, roundBreakSeconds: 30, warmupSeconds: 60, cooldownSeconds: 60, classSeconds: 470 });
    expect(r.totals.marked).toMatchObject({ workSeconds: 243, restSeconds: 77, classSeconds: 470 });
    const circuit = r.totals.blocks[1]!;
    expect(circuit).toMatchObject({ kind: 'circuit', plannedSeconds: 350, markedSeconds: 350, plannedWorkSeconds: 240, markedWorkSeconds: 243 });
    expect(circuit.rounds).toEqual([
      { round: 1, plannedWorkSeconds: 120, markedWorkSeconds: 120, plannedRestSeconds: 70, markedRestSeconds: 70 },
      { round: 2, plannedWorkSeconds: 120, markedWorkSeconds: 123, plannedRestSeconds: 40, markedRestSeconds: 37 },
    ]);
    expect(r.totals).toMatchObject({ advertisedSeconds: 480, classVsAdvertisedSeconds: -10, mediaSeconds: 600 });
  });
});
