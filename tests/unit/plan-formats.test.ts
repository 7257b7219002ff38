/**
 * The formats coaches teach beyond circuits and intervals: stations done per side, AMRAP and
 * EMOM. Every plan here is invented for the test (not demo data); the schedules are worked out
 * by hand in the comments and checked against the expansion, the check, the chapters and the clock.
 */
import { describe, expect, it } from 'vitest';
import { expandPlan } from '~/lib/plan/expand-plan';
import { messagesByPath } from '~/lib/plan/plan-editing';
import { blockPlannedSeconds, planSchema } from '~/lib/plan/plan-schema';
import { BUILT_IN_TEMPLATES } from '~/lib/plan/plan-templates';
import { buildChapters } from '~/lib/publishing/chapters';
import { clockAt, clockHeading, clockTimeline } from '~/lib/publishing/interval-clock';
import { applyAllFixes } from '~/lib/timing/apply-fix';
import { checkTiming } from '~/lib/timing/timing-check';
import type { Timeline } from '~/lib/timeline/timeline-schema';
import { codes, edit, plan, timelineFromPlan, without } from './timing-fixtures';

/** Moves the boundary between two back-to-back segments. */
const moveBoundary = (t: Timeline, left: string, right: string, at: number): Timeline =>
  edit(edit(t, left, { endSeconds: at }), right, { startSeconds: at });

const fieldMessages = (input: unknown) => {
  const parsed = planSchema.safeParse(input);
  return parsed.success ? {} : messagesByPath(parsed.error.issues);
};

// Sides, worked by hand: 2 rounds of A (40 s work, 20 s rest) and Side lunge per side (30 s each
// side, 5 s switch pause, 15 s rest), 60 s round break, default options (the break replaces the
// last rest of a round, the final rest is dropped).
// Round 1: A 0–40, rest 40–60, left 60–90, switch 90–95, right 95–125, break 125–185
// Round 2: A 185–225, rest 225–245, left 245–275, switch 275–280, right 280–310
// Total 310 s: work 2 × (40 + 30 + 30) = 200, rests 2 × (20 + 5) = 50, break 60.
const sides = plan({
  blocks: [
    {
      kind: 'circuit',
      rounds: 2,
      roundBreakSeconds: 60,
      stations: [
        { exercise: 'A', workSeconds: 40, restSeconds: 20 },
        { exercise: 'Side lunge', workSeconds: 30, restSeconds: 15, perSide: true, switchSeconds: 5 },
      ],
    },
  ],
});

describe('stations done per side', () => {
  it('expand to left work, the switch pause, right work, then the station rest, as worked by hand', () => {
    const s = expandPlan(sides);
    expect(s.segments.map((p) => [p.kind, p.exercise ?? '', p.side ?? '', p.startSeconds, p.startSeconds + p.seconds])).toEqual([
      ['work', 'A', '', 0, 40], ['rest', 'A', '', 40, 60],
      ['work', 'Side lunge', 'left', 60, 90], ['rest', 'Side lunge', 'left', 90, 95], ['work', 'Side lunge', 'right', 95, 125],
      ['round-break', '', '', 125, 185],
      ['work', 'A', '', 185, 225], ['rest', 'A', '', 225, 245],
      ['work', 'Side lunge', 'left', 245, 275], ['rest', 'Side lunge', 'left', 275, 280], ['work', 'Side lunge', 'right', 280, 310],
    ]);
    expect(s.totals).toMatchObject({ classSeconds: 310, workSeconds: 200, restSeconds: 50, roundBreakSeconds: 60 });
    expect(blockPlannedSeconds(sides.blocks[0]!, sides.options)).toBe(310);
  });

  it('a switch pause of 0 (or none) puts the right side straight after the left', () => {
    const p = plan({ blocks: [{ kind: 'circuit', rounds: 1, stations: [{ exercise: 'Step-up', workSeconds: 20, restSeconds: 10, perSide: true }] }] });
    expect(expandPlan(p).segments.map((x) => `${x.kind}:${x.side}:${x.seconds}`)).toEqual(['work:left:20', 'work:right:20']);
  });

  it('a timeline marking each side exactly has no finding', () => {
    expect(checkTiming(sides, timelineFromPlan(sides), { mediaSeconds: 310 }).findings).toEqual([]);
  });

  it('the check matches per side: a short left side is named, with a fix', () => {
    // s2 is round 1's left side (60–90), s3 its switch pause (90–95).
    const r = checkTiming(sides, moveBoundary(timelineFromPlan(sides), 's2', 's3', 86));
    expect(codes(r.findings)).toEqual(['work-too-short']);
    expect(r.findings[0]!.message).toContain('Side lunge, left side (round 1, station 2)');
    expect(r.findings[0]!.fix).toBeDefined();
    expect(applyAllFixes(sides, moveBoundary(timelineFromPlan(sides), 's2', 's3', 86)).timeline.segments.find((x) => x.id === 's2')).toMatchObject({ endSeconds: 90 });
  });

  it('a side that is not marked is reported as that side, and the finding says which side to mark', () => {
    const r = checkTiming(sides, without(timelineFromPlan(sides), 's4'));
    const missing = r.findings.find((f) => f.code === 'missing-station');
    expect(missing?.message).toContain('Side lunge, right side (round 1, station 2) is not marked');
    expect(missing?.missing).toMatchObject({ blockIndex: 0, stationIndex: 1, round: 1, side: 'right', exercise: 'Side lunge', seconds: 30 });
  });

  it('a side marked as the other side is not taken for it', () => {
    // Round 2's left side marked "right": the plan has the left side there.
    const r = checkTiming(sides, edit(timelineFromPlan(sides), 's8', { side: 'right' }));
    expect(codes(r.findings)).toEqual(['unexpected-station']);
    expect(r.findings[0]!.message).toContain('(right side) at 4:05.0 is not what the plan has here: it expects Side lunge, left side (round 2, station 2)');
  });

  it('a switch pause too long is a rest finding about the switch pause', () => {
    const t = timelineFromPlan(sides);
    // Stretch the switch pause of round 1 (s3, 90–95) to 90–101 and move everything after it.
    const stretched: Timeline = { ...t, segments: t.segments.map((x, i) => (i > 3 ? { ...x, startSeconds: x.startSeconds + 6, endSeconds: x.endSeconds + 6 } : i === 3 ? { ...x, endSeconds: 101 } : x)) };
    const r = checkTiming(sides, stretched);
    expect(codes(r.findings)).toEqual(['rest-too-long']);
    expect(r.findings[0]!.message).toContain('the switch pause of Side lunge (round 1, station 2)');
  });

  it('schema: a switch pause needs the station done per side', () => {
    expect(fieldMessages({ blocks: [{ kind: 'circuit', rounds: 1, stations: [{ exercise: 'A', workSeconds: 30, restSeconds: 10, switchSeconds: 5 }] }] })).toEqual({
      'blocks.0.stations.0.switchSeconds': 'A switch pause is only for a station done per side: turn on "per side" or set the pause to 0.',
    });
    expect(fieldMessages({ blocks: [{ kind: 'circuit', rounds: 1, stations: [{ exercise: 'A', workSeconds: 30, restSeconds: 10, perSide: true, switchSeconds: -1 }] }] })).toEqual({
      'blocks.0.stations.0.switchSeconds': 'The switch pause cannot be negative.',
    });
  });

  it('chapters and the clock say the side', () => {
    const t = timelineFromPlan(sides);
    expect(buildChapters(t.segments).map((c) => c.title)).toEqual([
      'A · round 1 of 2', 'Side lunge — left · round 1 of 2', 'Side lunge — right · round 1 of 2', 'Round break · round 1 of 2',
      'A · round 2 of 2', 'Side lunge — left · round 2 of 2', 'Side lunge — right · round 2 of 2',
    ]);
    const clock = clockTimeline(t.segments);
    expect(clockAt(clock, 70)).toMatchObject({ current: { label: 'Side lunge — left', side: 'left' }, round: 1, rounds: 2 });
    // In the switch pause: resting, and the right side comes next.
    expect(clockAt(clock, 92)).toMatchObject({ current: { kind: 'rest', label: 'Rest' }, next: { label: 'Side lunge — right', inSeconds: 3 } });
  });
});

// AMRAP, as the trade defines it (common practice, no source): as many rounds as possible of a
// list of exercises within one fixed, timed span. Worked by hand: warm-up 0–300, AMRAP 300–1020
// (12:00 = 720 s), cool-down 1020–1200; class 1200 s, of which 720 s work.
const amrap = plan({
  blocks: [
    { kind: 'warmup', seconds: 300 },
    { kind: 'amrap', seconds: 720, exercises: ['Burpee', 'Air squat', 'Push-up'] },
    { kind: 'cooldown', seconds: 180 },
  ],
});

describe('AMRAP', () => {
  it('expands to one timed work span, as worked by hand', () => {
    const s = expandPlan(amrap);
    expect(s.segments.map((p) => [p.kind, p.format ?? '', p.startSeconds, p.seconds])).toEqual([
      ['warmup', '', 0, 300], ['work', 'amrap', 300, 720], ['cooldown', '', 1020, 180],
    ]);
    expect(s.totals).toMatchObject({ classSeconds: 1200, workSeconds: 720 });
  });

  it('a timeline marking it exactly has no finding; an unnamed work mark stands for it too', () => {
    const t = timelineFromPlan(amrap);
    expect(checkTiming(amrap, t, { mediaSeconds: 1200, advertisedMinutes: 20 }).findings).toEqual([]);
    expect(checkTiming(amrap, edit(t, 's1', { format: undefined })).findings).toEqual([]);
  });

  it('a span 3 s too long is a work finding about the AMRAP, with a fix', () => {
    const t = moveBoundary(timelineFromPlan(amrap), 's1', 's2', 1023);
    const r = checkTiming(amrap, t);
    expect(codes(r.findings)).toEqual(['work-too-long']);
    expect(r.findings[0]!.message).toContain('the AMRAP of 12:00 (block 2)');
    expect(checkTiming(amrap, applyAllFixes(amrap, t).timeline).findings).toEqual([]);
  });

  it('an AMRAP that is not marked is reported, and can be marked at the playhead', () => {
    const r = checkTiming(amrap, without(timelineFromPlan(amrap), 's1'));
    const missing = r.findings.find((f) => f.code === 'missing-station');
    expect(missing?.message).toContain('The AMRAP of 12:00 (block 2) is not marked');
    expect(missing?.missing).toEqual({ blockIndex: 1, format: 'amrap', seconds: 720 });
  });

  it('a work mark named after one of its exercises is not the AMRAP span', () => {
    const r = checkTiming(amrap, edit(timelineFromPlan(amrap), 's1', { format: undefined, exercise: 'Burpee' }));
    expect(codes(r.findings)).toEqual(['unexpected-station']);
  });

  it('schema messages', () => {
    expect(fieldMessages({ blocks: [{ kind: 'amrap', seconds: 0, exercises: [] }] })).toEqual({
      'blocks.0.seconds': 'The AMRAP must be more than 0 seconds.',
      'blocks.0.exercises': 'The AMRAP needs at least one exercise.',
    });
    expect(fieldMessages({ blocks: [{ kind: 'amrap', seconds: 60, exercises: [''] }] })).toEqual({ 'blocks.0.exercises.0': 'The exercise needs a name.' });
  });

  it('chapter and clock: "AMRAP 12:00 — round as many as you can"', () => {
    const t = timelineFromPlan(amrap);
    expect(buildChapters(t.segments).map((c) => c.title)).toEqual(['Warm-up', 'AMRAP 12:00 — round as many as you can', 'Cool-down']);
    const clock = clockAt(clockTimeline(t.segments), 400);
    expect(clock).toMatchObject({ format: 'AMRAP 12:00', current: { label: 'Round as many as you can' }, remaining: 620 });
    expect(clockHeading(clock)).toBe('AMRAP 12:00');
  });
});

// EMOM, as the trade defines it (common practice, no source): a task starts at the top of every
// minute, what is left of the minute is rest, N minutes = N rounds. Worked by hand for 10 minutes
// with 40 s of work: minute m works from 60(m − 1) to 60(m − 1) + 40 and rests until 60m; the
// block lasts 600 s, 400 s work and 200 s rest; Burpee on odd minutes, Kettlebell swing on even.
const emom = plan({ blocks: [{ kind: 'emom', minutes: 10, workSeconds: 40, exercises: ['Burpee', 'Kettlebell swing'] }] });
// Segment ids from timelineFromPlan: minute m's work is s(2m − 2), its rest s(2m − 1).
const work = (m: number) => `s${2 * m - 2}`;
const rest = (m: number) => `s${2 * m - 1}`;

describe('EMOM', () => {
  it('expands minute by minute, as worked by hand', () => {
    const s = expandPlan(emom);
    const works = s.segments.filter((p) => p.kind === 'work');
    expect(works.map((p) => p.startSeconds)).toEqual([0, 60, 120, 180, 240, 300, 360, 420, 480, 540]);
    expect(works.map((p) => p.exercise)).toEqual(Array.from({ length: 10 }, (_, i) => (i % 2 === 0 ? 'Burpee' : 'Kettlebell swing')));
    expect(s.segments.filter((p) => p.kind === 'rest').map((p) => [p.startSeconds, p.seconds])[2]).toEqual([160, 20]);
    expect(s.totals).toMatchObject({ classSeconds: 600, workSeconds: 400, restSeconds: 200 });
    // The last minute keeps its rest whatever the plan's final-rest option says: 10 minutes last 10 minutes.
    expect(expandPlan(plan({ ...emom, options: { dropFinalRest: true } })).totals.classSeconds).toBe(600);
  });

  it('a timeline marking it exactly has no finding', () => {
    expect(checkTiming(emom, timelineFromPlan(emom), { mediaSeconds: 600, advertisedMinutes: 10 }).findings).toEqual([]);
  });

  it('work is what the coach marks: a shorter or longer work inside the minute is not reported', () => {
    const t = moveBoundary(moveBoundary(timelineFromPlan(emom), work(3), rest(3), 145), work(4), rest(4), 238);
    expect(checkTiming(emom, t).findings).toEqual([]);
  });

  it('the check tests the minute boundaries: 2 s late is within the work tolerance, 2.001 s is not', () => {
    expect(checkTiming(emom, moveBoundary(timelineFromPlan(emom), rest(2), work(3), 122)).findings).toEqual([]);
    const late = moveBoundary(timelineFromPlan(emom), rest(2), work(3), 122.001);
    const r = checkTiming(emom, late);
    expect(codes(r.findings)).toEqual(['emom-minute']);
    expect(r.findings[0]).toMatchObject({
      severity: 'error',
      segmentIds: [work(3)],
      message: 'Minute 3 of 10 of the EMOM (block 1), Burpee, starts at 2:02.0, 2 s after the top of the minute at 2:00.0. Move its start to 2:00.0.',
      fix: [
        { segmentId: rest(2), field: 'endSeconds', value: 120 },
        { segmentId: work(3), field: 'startSeconds', value: 120 },
      ],
    });
    expect(checkTiming(emom, applyAllFixes(emom, late).timeline).findings).toEqual([]);
  });

  it('an early minute is reported too, and one late minute does not shift the others', () => {
    const t = moveBoundary(timelineFromPlan(emom), rest(6), work(7), 355);
    const r = checkTiming(emom, t);
    expect(r.findings).toHaveLength(1);
    expect(r.findings[0]!.message).toContain('Minute 7 of 10');
    expect(r.findings[0]!.message).toContain('5 s before the top of the minute at 6:00.0');
  });

  it('the block must end with its last minute', () => {
    const withCooldown = plan({ blocks: [...emom.blocks, { kind: 'cooldown', seconds: 120 }] });
    // The last rest (s19, 580–600) runs 7 s into the cool-down (s20).
    const t = moveBoundary(timelineFromPlan(withCooldown), rest(10), 's20', 607);
    const r = checkTiming(withCooldown, t);
    const end = r.findings.find((f) => f.code === 'emom-minute');
    expect(end).toMatchObject({ severity: 'warning', segmentIds: [rest(10)] });
    expect(end!.message).toContain('should end at 10:00.0, 10 minutes after its first minute began');
  });

  it('a minute left out of the marks is a minute count finding', () => {
    const r = checkTiming(emom, without(timelineFromPlan(emom), work(4), rest(4)));
    const count = r.findings.find((f) => f.code === 'round-count');
    expect(count?.message).toBe('The plan has 10 minutes of the EMOM (block 1), but only 9 are marked. Mark the missing minutes or change the plan.');
  });

  it('schema messages', () => {
    expect(fieldMessages({ blocks: [{ kind: 'emom', minutes: 0, workSeconds: 60, exercises: [] }] })).toEqual({
      'blocks.0.minutes': 'An EMOM needs at least 1 minute.',
      'blocks.0.workSeconds': 'Work must be less than 60 seconds: what is left of the minute is the rest.',
      'blocks.0.exercises': 'The EMOM needs at least one exercise.',
    });
    expect(fieldMessages({ blocks: [{ kind: 'emom', minutes: 2.5, workSeconds: 30, exercises: ['A'] }] })).toEqual({ 'blocks.0.minutes': 'Minutes must be a whole number.' });
    expect(fieldMessages({ blocks: [{ kind: 'hiit', seconds: 60 }] })['blocks.0.kind']).toBe(
      'Each block needs a kind: warmup, circuit, intervals, amrap, emom, cooldown or talk.',
    );
  });

  it('chapters and clock: "EMOM minute 3 of 10 — Burpee"', () => {
    const t = timelineFromPlan(emom);
    const titles = buildChapters(t.segments).map((c) => c.title);
    expect(titles).toHaveLength(10);
    expect(titles[2]).toBe('EMOM minute 3 of 10 — Burpee');
    expect(titles[9]).toBe('EMOM minute 10 of 10 — Kettlebell swing');
    const clock = clockTimeline(t.segments);
    expect(clockAt(clock, 125)).toMatchObject({ format: 'EMOM minute 3 of 10', current: { label: 'Burpee' }, round: null, remaining: 35 });
    // Resting in minute 3: still minute 3; the next minute's move comes next.
    expect(clockAt(clock, 170)).toMatchObject({ format: 'EMOM minute 3 of 10', current: { label: 'Rest' }, next: { label: 'Kettlebell swing', inSeconds: 10 } });
  });

  it('EMOM minutes are not circuit rounds: a circuit next to an EMOM keeps its own round count', () => {
    const mixed = plan({ blocks: [{ kind: 'circuit', rounds: 2, stations: [{ exercise: 'Row', workSeconds: 30, restSeconds: 10 }] }, { kind: 'emom', minutes: 5, workSeconds: 30, exercises: ['Burpee'] }] });
    const titles = buildChapters(timelineFromPlan(mixed).segments).map((c) => c.title);
    expect(titles.slice(0, 3)).toEqual(['Row · round 1 of 2', 'Row · round 2 of 2', 'EMOM minute 1 of 5 — Burpee']);
  });
});

describe('built-in templates for the new formats', () => {
  const filled = (id: string) => {
    const t = BUILT_IN_TEMPLATES.find((x) => x.id === id)!;
    const blocks = t.plan.blocks.map((b) => ('exercises' in b ? { ...b, exercises: b.exercises.map((_, i) => `Move ${i + 1}`) } : b));
    return plan({ ...t.plan, blocks });
  };
  it('EMOM 10 min lasts 10 minutes (N minutes = N × 60 s, common practice, no source)', () => {
    expect(expandPlan(filled('emom-10')).totals.classSeconds).toBe(600);
  });
  it('AMRAP 12 min is one 720 s span (common practice, no source)', () => {
    expect(expandPlan(filled('amrap-12')).segments.map((s) => [s.kind, s.seconds])).toEqual([['work', 720]]);
  });
});
