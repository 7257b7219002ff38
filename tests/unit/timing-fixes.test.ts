import { describe, expect, it } from 'vitest';
import type { Timeline } from '~/lib/timeline/timeline-schema';
import { applyAllFixes, applyChanges, applyFix } from '~/lib/timing/apply-fix';
import type { Finding } from '~/lib/timing/finding-types';
import { checkTiming } from '~/lib/timing/timing-check';
import { edit, smallCircuit, timelineFromPlan, without } from './timing-fixtures';

const P = smallCircuit();
const base = (): Timeline => timelineFromPlan(P);
const ctx = { mediaSeconds: 470 };
const overlapCount = (t: Timeline) => checkTiming(P, t, ctx).findings.filter((f) => f.code === 'overlap').length;
const same = (a: Finding, b: Finding) => a.code === b.code && a.segmentIds.join() === b.segmentIds.join();

describe.each<[string, Timeline]>([
  ['work too short (boundary)', edit(edit(base(), 's1', { endSeconds: 69 }), 's2', { startSeconds: 69 })],
  ['work too long (boundary)', edit(edit(base(), 's3', { endSeconds: 170 }), 's4', { startSeconds: 170 })],
  ['work too short (gap after)', edit(base(), 's5', { endSeconds: 210 })],
  ['overlap', edit(base(), 's3', { startSeconds: 110 })],
  ['gap that a boundary can close', edit(base(), 's2', { endSeconds: 115 })],
  ['outside media', edit(base(), 's12', { endSeconds: 480 })],
  ['rest too long', edit(edit(base(), 's8', { endSeconds: 300 }), 's9', { startSeconds: 300 })],
  ['cool-down short', edit(base(), 's12', { endSeconds: 440 })],
])('fix for %s', (_name, t) => {
  const before = checkTiming(P, t, ctx).findings;
  const fixable = before.filter((f) => f.fix);
  it('is offered', () => expect(fixable.length).toBeGreaterThan(0));
  it.each(fixable.map((f) => [f.code, f] as const))('applying the %s fix removes it and adds no overlap', (_code, finding) => {
    const fixed = applyFix(t, finding);
    const after = checkTiming(P, fixed, ctx).findings;
    expect(after.some((f) => same(f, finding))).toBe(false);
    expect(overlapCount(fixed)).toBeLessThanOrEqual(overlapCount(t));
    expect(t).not.toBe(fixed); // a new timeline; the input is unchanged
  });
  it('applyAllFixes ends with no error', () => {
    const r = applyAllFixes(P, t, ctx);
    expect(r.converged).toBe(true);
    expect(checkTiming(P, r.timeline, ctx).ok).toBe(true);
  });
});

describe('fixes', () => {
  it('move the shared boundary of a mis-placed mark for both segments', () => {
    const t = edit(edit(base(), 's1', { endSeconds: 69 }), 's2', { startSeconds: 69 });
    const f = checkTiming(P, t).findings.find((x) => x.code === 'work-too-short')!;
    expect(f.fix).toEqual([
      { segmentId: 's1', field: 'endSeconds', value: 100 },
      { segmentId: 's2', field: 'startSeconds', value: 100 },
    ]);
    expect(checkTiming(P, applyFix(t, f)).findings).toEqual([]);
  });
  it('are not offered for a gap that is a missing station', () => {
    const f = checkTiming(P, without(base(), 's9', 's10')).findings.find((x) => x.code === 'gap')!;
    expect(f.fix).toBeUndefined();
  });
  it('refuse changes that do not belong to the timeline', () => {
    expect(() => applyChanges(base(), [{ segmentId: 'nope', field: 'endSeconds', value: 1 }])).toThrow(/not in this timeline/);
    expect(() => applyChanges(base(), [{ segmentId: 's1', field: 'endSeconds', value: 50 }])).toThrow(/without length/);
  });
  it('applyAllFixes leaves a clean timeline untouched', () => {
    const r = applyAllFixes(P, base(), ctx);
    expect(r).toMatchObject({ passes: 1, appliedCount: 0, converged: true });
  });
});
