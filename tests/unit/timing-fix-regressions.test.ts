import { describe, expect, it } from 'vitest';
import { planSchema } from '~/lib/plan/plan-schema';
import { checkTiming } from '~/lib/timing/timing-check';
import { applyAllFixes } from '~/lib/timing/apply-fix';
import type { Segment } from '~/lib/timeline/timeline-schema';
import { expandPlan } from '~/lib/plan/expand-plan';
import { runFixRounds, withMovedBoundaries, type BoundaryMove } from './fix-rounds';
import { timelineFromPlan } from './timing-fixtures';

// Found by the fast-check property "applying every suggested fix converges": a work interval
// squeezed between two short rests, where neither side alone has room to make it 10 s.
describe('fixes that need room from both neighbours', () => {
  const plan = planSchema.parse({
    blocks: [{ kind: 'intervals', exercise: 'Squat', sets: 3, workSeconds: 10, restSeconds: 1 }],
    options: { roundBreakReplacesLastRest: false, dropFinalRest: false },
  });
  const seg = (id: string, kind: Segment['kind'], startSeconds: number, endSeconds: number): Segment => ({ id, kind, startSeconds, endSeconds });
  const segments = [
    seg('s0', 'work', 0, 10.34),
    seg('s1', 'rest', 10.34, 12.681),
    seg('s2', 'work', 12.681, 20.34),
    seg('s3', 'rest', 20.34, 22),
    seg('s4', 'work', 22, 32),
    seg('s5', 'rest', 32, 33),
  ];

  it('offers a fix that lengthens the work at both ends', () => {
    const before = checkTiming(plan, { segments, cues: [] }, { mediaSeconds: 33 });
    const short = before.findings.find((f) => f.code === 'work-too-short')!;
    expect(short.fix).toBeDefined();
    const result = applyAllFixes(plan, { segments, cues: [] }, { mediaSeconds: 33 });
    expect(result.converged).toBe(true);
    const after = checkTiming(plan, result.timeline, { mediaSeconds: 33 });
    expect(after.findings.filter((f) => f.severity === 'error')).toEqual([]);
    const work = result.timeline.segments.find((s) => s.id === 's2')!;
    expect(Math.round((work.endSeconds - work.startSeconds) * 1000)).toBe(10_000);
  });
});

// Found by the fast-check property "fixing every format settles" (timing-properties.test.ts):
// invented plans with known boundary moves on their exact marking, where "Apply all fixes"
// used to bring a finding back, report more than before, or keep offering fixes.
describe('fixing settles on the cases random runs found', () => {
  it.each<[string, unknown, BoundaryMove[]]>([
    ["an EMOM's end fix would squeeze the warm-up after it", {"blocks": [{"kind": "emom", "minutes": 8, "exercises": ["Squat"], "workSeconds": 10}, {"kind": "warmup", "seconds": 20}, {"kind": "warmup", "seconds": 20}], "options": {"roundBreakReplacesLastRest": false, "dropFinalRest": false}}, [{"pick": 1972157469, "fraction": -0.301}, {"pick": 0, "fraction": 0}]],
    ["an EMOM's first top would squeeze the AMRAP before it", {"blocks": [{"kind": "warmup", "seconds": 20}, {"kind": "amrap", "seconds": 60, "exercises": ["Squat"]}, {"kind": "emom", "minutes": 6, "exercises": ["Squat"], "workSeconds": 10}], "options": {"roundBreakReplacesLastRest": false, "dropFinalRest": false}}, [{"pick": 61946756, "fraction": 0.201}, {"pick": 0, "fraction": 0.065}]],
    ["two EMOM blocks back to back disagree on where the second begins", {"blocks": [{"kind": "circuit", "rounds": 2, "roundBreakSeconds": 1, "stations": [{"exercise": "Squat", "workSeconds": 10, "restSeconds": 6}]}, {"kind": "emom", "minutes": 4, "exercises": ["Squat"], "workSeconds": 10}, {"kind": "emom", "minutes": 6, "exercises": ["Squat"], "workSeconds": 10}, {"kind": "emom", "minutes": 5, "exercises": ["Squat"], "workSeconds": 10}], "options": {"roundBreakReplacesLastRest": false, "dropFinalRest": false}}, [{"pick": 522144940, "fraction": -0.834}, {"pick": 652479354, "fraction": -0.101}, {"pick": 0, "fraction": 0}]],
    ["a rest taking up a moved chain turned from too long to too short", {"blocks": [{"kind": "intervals", "exercise": "Squat", "sets": 5, "workSeconds": 10, "restSeconds": 8, "perSide": true, "switchSeconds": 1}, {"kind": "amrap", "seconds": 60, "exercises": ["Squat"]}, {"kind": "circuit", "rounds": 2, "roundBreakSeconds": 1, "stations": [{"exercise": "Squat", "workSeconds": 10, "restSeconds": 6, "perSide": true, "switchSeconds": 1}, {"exercise": "Squat", "workSeconds": 32, "restSeconds": 0, "perSide": true, "switchSeconds": 1}]}, {"kind": "circuit", "rounds": 3, "roundBreakSeconds": 1, "stations": [{"exercise": "Squat", "workSeconds": 10, "restSeconds": 1}, {"exercise": "Squat", "workSeconds": 10, "restSeconds": 0, "perSide": true, "switchSeconds": 1}]}], "options": {"roundBreakReplacesLastRest": false, "dropFinalRest": true}}, [{"pick": 331914755, "fraction": 0.316}, {"pick": 491732839, "fraction": -0.336}, {"pick": 2127103719, "fraction": -0.626}]],
    ["a length fix moved an EMOM's end", {"blocks": [{"kind": "emom", "minutes": 3, "exercises": ["Squat"], "workSeconds": 10}, {"kind": "emom", "minutes": 3, "exercises": ["Squat"], "workSeconds": 24}, {"kind": "warmup", "seconds": 98}, {"kind": "circuit", "rounds": 1, "roundBreakSeconds": 0, "stations": [{"exercise": "Squat", "workSeconds": 10, "restSeconds": 19, "perSide": true, "switchSeconds": 1}, {"exercise": "Squat", "workSeconds": 10, "restSeconds": 0, "perSide": true, "switchSeconds": 1}]}], "options": {"roundBreakReplacesLastRest": false, "dropFinalRest": false}}, [{"pick": 1489558224, "fraction": 0.418}, {"pick": 2037608560, "fraction": 0.79}, {"pick": 1029518393, "fraction": 0.307}, {"pick": 1455593978, "fraction": 0.418}, {"pick": 0, "fraction": 0}]],
    ["one late EMOM minute made the other four count as early", {"blocks": [{"kind": "intervals", "exercise": "Squat", "sets": 2, "workSeconds": 10, "restSeconds": 0, "perSide": true, "switchSeconds": 1}, {"kind": "emom", "minutes": 5, "exercises": ["Squat"], "workSeconds": 10}], "options": {"roundBreakReplacesLastRest": false, "dropFinalRest": false}}, [{"pick": 552542821, "fraction": 0.201}, {"pick": 531631520, "fraction": 0.301}]],
  ])('%s', (_name, input, moves) => {
    const p = planSchema.parse(input);
    const t = withMovedBoundaries(timelineFromPlan(p), moves);
    const run = runFixRounds(p, t, { mediaSeconds: expandPlan(p).totals.classSeconds }, 12);
    expect(run.reappeared).toEqual([]);
    for (let k = 1; k < run.counts.length; k++) expect(run.counts[k]!).toBeLessThanOrEqual(run.counts[k - 1]!);
    expect(run.settled).toBe(true);
    expect(run.final.filter((f) => f.fix)).toEqual([]);
  });

  it('a work mark squeezed at the class end gets the nearest length its neighbours allow', () => {
    // Intervals 2 × 10 s work / 1 s rest, final rest dropped: 0–10, 10–11, 11–21 (invented).
    // The last work was marked 14.005–21 (7 s); taking 3 s from the first work would leave it
    // 7.995 s, past its own tolerance, so the fix makes the last one 8 s (10 s − 2 s) instead.
    const p = planSchema.parse({ blocks: [{ kind: 'intervals', exercise: 'Squat', sets: 2, workSeconds: 10, restSeconds: 1 }] });
    const segments = [seg('s0', 'work', 0, 11), seg('s1', 'rest', 11, 14.005), seg('s2', 'work', 14.005, 21)];
    const short = checkTiming(p, { segments, cues: [] }, { mediaSeconds: 21 }).findings.find((f) => f.code === 'work-too-short')!;
    expect(short.message).toContain('The suggested fix makes it 8 s, the nearest the neighbouring marks allow within the tolerance.');
    expect(short.fix).toEqual([{ segmentId: 's1', field: 'endSeconds', value: 13 }, { segmentId: 's2', field: 'startSeconds', value: 13 }]);
    const result = applyAllFixes(p, { segments, cues: [] }, { mediaSeconds: 21 });
    expect(checkTiming(p, result.timeline, { mediaSeconds: 21 }).findings).toEqual([]);
  });
});

function seg(id: string, kind: Segment['kind'], startSeconds: number, endSeconds: number): Segment {
  return { id, kind, startSeconds, endSeconds };
}
