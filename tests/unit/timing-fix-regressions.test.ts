import { describe, expect, it } from 'vitest';
import { planSchema } from '~/lib/plan/plan-schema';
import { checkTiming } from '~/lib/timing/timing-check';
import { applyAllFixes } from '~/lib/timing/apply-fix';
import type { Segment } from '~/lib/timeline/timeline-schema';

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
