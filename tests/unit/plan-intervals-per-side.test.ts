/**
 * Intervals done per side: every set is the move on the left, a pause to switch, then the
 * right. The plan here is invented for the test (not demo data); its schedule is worked out by
 * hand below and checked against the expansion, the check, its fixes, the chapters and the clock.
 */
import { describe, expect, it } from 'vitest';
import { expandPlan } from '~/lib/plan/expand-plan';
import { draftBlockSeconds, messagesByPath } from '~/lib/plan/plan-editing';
import { blockPlannedSeconds, planSchema } from '~/lib/plan/plan-schema';
import { buildChapters } from '~/lib/publishing/chapters';
import { clockAt, clockTimeline } from '~/lib/publishing/interval-clock';
import { applyAllFixes } from '~/lib/timing/apply-fix';
import { checkTiming } from '~/lib/timing/timing-check';
import { codes, edit, plan, timelineFromPlan, without } from './timing-fixtures';

// Single-leg deadlift, 3 sets of 30 s per side, 5 s switch pause, 20 s rest, default options
// (the final rest is dropped). Worked by hand:
// set 1: left 0–30, switch 30–35, right 35–65, rest 65–85
// set 2: left 85–115, switch 115–120, right 120–150, rest 150–170
// set 3: left 170–200, switch 200–205, right 205–235 (no rest after the last set)
// Block: 3 × (30 + 5 + 30) + 2 × 20 = 195 + 40 = 235 s, of which 180 s work.
const perSide = plan({
  blocks: [{ kind: 'intervals', exercise: 'Single-leg deadlift', sets: 3, workSeconds: 30, restSeconds: 20, perSide: true, switchSeconds: 5 }],
});

const fieldMessages = (input: unknown) => {
  const parsed = planSchema.safeParse(input);
  return parsed.success ? {} : messagesByPath(parsed.error.issues);
};

describe('intervals done per side', () => {
  it('expand into left, switch pause, right and rest for every set, each with its set and side', () => {
    const s = expandPlan(perSide);
    expect(s.segments.map((p) => [p.kind, p.side ?? '', p.set, p.startSeconds, p.startSeconds + p.seconds])).toEqual([
      ['work', 'left', 1, 0, 30], ['rest', 'left', 1, 30, 35], ['work', 'right', 1, 35, 65], ['rest', 'right', 1, 65, 85],
      ['work', 'left', 2, 85, 115], ['rest', 'left', 2, 115, 120], ['work', 'right', 2, 120, 150], ['rest', 'right', 2, 150, 170],
      ['work', 'left', 3, 170, 200], ['rest', 'left', 3, 200, 205], ['work', 'right', 3, 205, 235],
    ]);
    expect(s.totals).toMatchObject({ workSeconds: 180, restSeconds: 55, classSeconds: 235 });
    expect(blockPlannedSeconds(perSide.blocks[0]!, perSide.options)).toBe(235);
    // The builder shows the same length while the coach types.
    expect(draftBlockSeconds(perSide.blocks[0]!, perSide.options)).toBe(235);
  });

  it('keep the last set\'s rest when the plan says so, and put the right side straight after the left without a pause', () => {
    const p = plan({
      blocks: [{ kind: 'intervals', exercise: 'Step-up', sets: 2, workSeconds: 20, restSeconds: 10, perSide: true }],
      options: { dropFinalRest: false },
    });
    // By hand: 2 × (20 + 20 + 10) = 100 s.
    expect(expandPlan(p).segments.map((x) => `${x.kind}:${x.side}:${x.seconds}`)).toEqual([
      'work:left:20', 'work:right:20', 'rest:right:10', 'work:left:20', 'work:right:20', 'rest:right:10',
    ]);
    expect(blockPlannedSeconds(p.blocks[0]!, p.options)).toBe(100);
  });

  it('a timeline marking each side exactly has no finding', () => {
    expect(checkTiming(perSide, timelineFromPlan(perSide), { mediaSeconds: 235 }).findings).toEqual([]);
  });

  it('the check holds each side to the work length and names the side, and its fix settles it', () => {
    // s0 is set 1's left side (0–30), s1 its switch pause (30–35): end the left side at 26 s.
    // The left side is 4 s short (work tolerance 2 s); the pause is 9 s, 4 s long, within the 5 s rest tolerance.
    const t = edit(edit(timelineFromPlan(perSide), 's0', { endSeconds: 26 }), 's1', { startSeconds: 26 });
    const r = checkTiming(perSide, t);
    expect(codes(r.findings)).toEqual(['work-too-short']);
    const short = r.findings.find((f) => f.code === 'work-too-short')!;
    expect(short.message).toContain('Single-leg deadlift, left side (set 1)');
    const fixed = applyAllFixes(perSide, t);
    expect(fixed.converged).toBe(true);
    expect(checkTiming(perSide, fixed.timeline).findings).toEqual([]);
  });

  it('an unmarked side is reported as that side of that set, ready to be marked', () => {
    // s6 is set 2's right side (120–150).
    const r = checkTiming(perSide, without(timelineFromPlan(perSide), 's6'));
    const missing = r.findings.find((f) => f.code === 'missing-station');
    expect(missing?.message).toContain('Single-leg deadlift, right side (set 2) is not marked');
    expect(missing?.missing).toMatchObject({ blockIndex: 0, set: 2, side: 'right', exercise: 'Single-leg deadlift', seconds: 30 });
  });

  it('a side marked as the other side is not taken for it', () => {
    // Set 2's left side (s4) marked "right": the plan has the left side there.
    const r = checkTiming(perSide, edit(timelineFromPlan(perSide), 's4', { side: 'right' }));
    expect(r.findings.map((f) => f.code)).toContain('unexpected-station');
    expect(r.findings.find((f) => f.code === 'unexpected-station')!.message).toContain('it expects Single-leg deadlift, left side (set 2)');
    // Setting the side back clears it.
    expect(checkTiming(perSide, edit(timelineFromPlan(perSide), 's4', { side: 'left' })).findings).toEqual([]);
  });

  it('a whole block left unmarked is counted in sets, not per side', () => {
    const t = timelineFromPlan(plan({ blocks: [{ kind: 'warmup', seconds: 60 }, perSide.blocks[0]!] }));
    const p = plan({ blocks: [{ kind: 'warmup', seconds: 60 }, perSide.blocks[0]!] });
    const onlyWarmup = { ...t, segments: t.segments.slice(0, 1) };
    const r = checkTiming(p, onlyWarmup);
    expect(r.findings.find((f) => f.code === 'round-count')?.message).toBe(
      'The plan has 3 sets of the Single-leg deadlift intervals (block 2), but only 0 are marked. Mark the missing sets or change the plan.',
    );
  });

  it('chapters and the clock say the side', () => {
    const t = timelineFromPlan(perSide);
    const titles = buildChapters(t.segments).map((c) => c.title);
    expect(titles[0]).toContain('Single-leg deadlift — left');
    expect(titles[1]).toContain('Single-leg deadlift — right');
    const clock = clockTimeline(t.segments);
    expect(clockAt(clock, 10)).toMatchObject({ current: { label: 'Single-leg deadlift — left', side: 'left' } });
    // In the switch pause the right side comes next, 3 s away (33 → 35).
    expect(clockAt(clock, 32)).toMatchObject({ current: { kind: 'rest' }, next: { label: 'Single-leg deadlift — right', inSeconds: 3 } });
  });

  it('schema: a switch pause needs intervals done per side; per side takes a true/false', () => {
    expect(fieldMessages({ blocks: [{ kind: 'intervals', exercise: 'A', sets: 2, workSeconds: 30, restSeconds: 10, switchSeconds: 5 }] })).toEqual({
      'blocks.0.switchSeconds': 'A switch pause is only for intervals done per side: turn on "per side" or set the pause to 0.',
    });
    expect(fieldMessages({ blocks: [{ kind: 'intervals', exercise: 'A', sets: 2, workSeconds: 30, restSeconds: 10, perSide: 'yes' }] })).toEqual({
      'blocks.0.perSide': 'Per side must be true or false.',
    });
  });

  it('the 20,000-interval bound counts both sides', () => {
    // 500 sets per side are 4 planned spans each (left, switch, right, rest): 41 blocks × 2,000 > 20,000.
    const block = { kind: 'intervals', exercise: 'A', sets: 500, workSeconds: 1, restSeconds: 0, perSide: true, switchSeconds: 0 };
    const msgs = fieldMessages({ blocks: Array.from({ length: 11 }, () => block) });
    expect(msgs['blocks']).toBe('This plan has 22000 intervals; at most 20000 are allowed. Check the rounds and sets.');
  });
});
