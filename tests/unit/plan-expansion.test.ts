import { describe, expect, it } from 'vitest';
import { expandPlan } from '~/lib/plan/expand-plan';
import { DEFAULT_TOLERANCES, planSchema } from '~/lib/plan/plan-schema';
import { plan } from './timing-fixtures';

const tabata = (dropFinalRest: boolean) =>
  plan({
    blocks: [{ kind: 'intervals', exercise: 'Fast feet', sets: 8, workSeconds: 20, restSeconds: 10 }],
    options: { dropFinalRest },
  });

const strengthCircuit = (roundBreakReplacesLastRest: boolean, dropFinalRest: boolean, roundBreakSeconds = 0) =>
  plan({
    blocks: [
      {
        kind: 'circuit',
        rounds: 3,
        roundBreakSeconds,
        stations: ['S1', 'S2', 'S3', 'S4', 'S5', 'S6'].map((exercise) => ({ exercise, workSeconds: 45, restSeconds: 15 })),
      },
    ],
    options: { roundBreakReplacesLastRest, dropFinalRest },
  });

describe('expandPlan check values', () => {
  // Tabata I. et al., Med Sci Sports Exerc 1996;28(10):1327–1330: 8 × (20 s work + 10 s rest) = 240 s.
  // Holds when the final rest is kept (dropFinalRest: false).
  it('Tabata protocol: 8 × (20 s + 10 s) = 240 s with the final rest kept', () => {
    const s = expandPlan(tabata(false));
    expect(s.totals.classSeconds).toBe(240);
    expect(s.totals.workSeconds).toBe(160);
    expect(s.totals.restSeconds).toBe(80);
    expect(s.segments).toHaveLength(16);
  });
  it('Tabata with the final rest dropped ends 10 s earlier (230 s)', () => {
    expect(expandPlan(tabata(true)).totals.classSeconds).toBe(230);
  });

  // Common practice, no source: 6 stations × (45 s + 15 s) × 3 rounds = 18 min, 13 min 30 s of work.
  // Holds with no round break when every station keeps its rest (roundBreakReplacesLastRest: false,
  // dropFinalRest: false), or with a 15 s round break replacing the last rest (and the final rest kept).
  it.each([
    [false, false, 0],
    [true, false, 15],
  ])('strength circuit = 18:00 with 13:30 work (replaces %s, dropFinal %s, break %s s)', (replaces, drop, brk) => {
    const s = expandPlan(strengthCircuit(replaces, drop, brk));
    expect(s.totals.classSeconds).toBe(18 * 60);
    expect(s.totals.workSeconds).toBe(13 * 60 + 30);
  });
  it('the same circuit with both defaults and no break is 17:15 (two last rests replaced by 0 s breaks, final rest dropped)', () => {
    // 810 s work + (18 − 3) × 15 s rest = 1035 s
    expect(expandPlan(strengthCircuit(true, true, 0)).totals.classSeconds).toBe(1035);
  });
});

describe('expandPlan order and options', () => {
  const p = (replaces: boolean, drop: boolean) =>
    plan({
      blocks: [
        { kind: 'warmup', seconds: 100 },
        {
          kind: 'circuit',
          rounds: 2,
          roundBreakSeconds: 60,
          stations: [
            { exercise: 'Squat', workSeconds: 30, restSeconds: 10 },
            { exercise: 'Row', workSeconds: 30, restSeconds: 15 },
          ],
        },
        { kind: 'cooldown', seconds: 50 },
      ],
      options: { roundBreakReplacesLastRest: replaces, dropFinalRest: drop },
    });
  const shape = (replaces: boolean, drop: boolean) =>
    expandPlan(p(replaces, drop), 5).segments.map((s) => `${s.kind}:${s.seconds}@${s.startSeconds}`);

  it('replaces last rest + drops final rest', () => {
    expect(shape(true, true)).toEqual([
      'warmup:100@5', 'work:30@105', 'rest:10@135', 'work:30@145', 'round-break:60@175',
      'work:30@235', 'rest:10@265', 'work:30@275', 'cooldown:50@305',
    ]);
  });
  it('keeps last rest before the break + keeps final rest', () => {
    expect(shape(false, false)).toEqual([
      'warmup:100@5', 'work:30@105', 'rest:10@135', 'work:30@145', 'rest:15@175', 'round-break:60@190',
      'work:30@250', 'rest:10@280', 'work:30@290', 'rest:15@320', 'cooldown:50@335',
    ]);
  });
  it('labels rounds, stations and blocks, and totals per kind', () => {
    const s = expandPlan(p(true, true));
    const rowRound2 = s.segments.find((x) => x.kind === 'work' && x.exercise === 'Row' && x.round === 2);
    expect(rowRound2).toMatchObject({ blockIndex: 1, stationIndex: 1, startSeconds: 270 });
    expect(s.totals).toEqual({
      workSeconds: 120, restSeconds: 20, roundBreakSeconds: 60, warmupSeconds: 100,
      cooldownSeconds: 50, talkSeconds: 0, classSeconds: 350,
    });
  });
  it('emits no zero-length rest or round break', () => {
    const s = expandPlan(plan({ blocks: [{ kind: 'circuit', rounds: 2, stations: [{ exercise: 'X', workSeconds: 10, restSeconds: 0 }] }] }));
    expect(s.segments.map((x) => x.kind)).toEqual(['work', 'work']);
  });
});

describe('planSchema', () => {
  it('fills documented defaults', () => {
    const p = plan({ blocks: [{ kind: 'talk', seconds: 30 }] });
    expect(p.tolerances).toEqual(DEFAULT_TOLERANCES);
    expect(p.tolerances).toEqual({ workSeconds: 2, restSeconds: 5, blockSeconds: 15, gapSeconds: 3, advertisedPercent: 10 });
    expect(p.options).toEqual({ roundBreakReplacesLastRest: true, dropFinalRest: true });
  });
  it('accepts the example from the issue as written', () => {
    const r = planSchema.safeParse({
      blocks: [
        { kind: 'warmup', seconds: 240 },
        { kind: 'circuit', rounds: 4, roundBreakSeconds: 60, stations: [{ exercise: 'Goblet squat', workSeconds: 40, restSeconds: 20 }] },
        { kind: 'intervals', exercise: 'Fast feet', sets: 8, workSeconds: 20, restSeconds: 10 },
        { kind: 'cooldown', seconds: 180 },
      ],
      tolerances: { workSeconds: 2, restSeconds: 5, blockSeconds: 15, gapSeconds: 3, advertisedPercent: 10 },
      options: { roundBreakReplacesLastRest: true, dropFinalRest: true },
    });
    expect(r.success).toBe(true);
  });
  it.each([
    [{ blocks: [] }, 'at least one block'],
    [{ blocks: [{ kind: 'yoga', seconds: 10 }] }, 'kind'],
    [{ blocks: [{ kind: 'warmup', seconds: 0 }] }, 'more than 0'],
    [{ blocks: [{ kind: 'warmup', seconds: 12.5 }] }, 'whole seconds'],
    [{ blocks: [{ kind: 'circuit', rounds: 0, stations: [{ exercise: 'X', workSeconds: 10, restSeconds: 0 }] }] }, 'at least 1 round'],
    [{ blocks: [{ kind: 'circuit', rounds: 1, stations: [] }] }, 'at least one station'],
    [{ blocks: [{ kind: 'circuit', rounds: 1, stations: Array.from({ length: 501 }, () => ({ exercise: 'X', workSeconds: 1, restSeconds: 0 })) }] }, 'at most 500 stations'],
    [{ blocks: [{ kind: 'intervals', exercise: 'X', sets: 200, workSeconds: 300, restSeconds: 0 }] }, '12 hours'],
    [{ blocks: [{ kind: 'intervals', exercise: '  ', sets: 1, workSeconds: 3, restSeconds: 0 }] }, 'needs a name'],
    [{ blocks: [{ kind: 'talk', seconds: 5 }], tolerances: { workSeconds: -1 } }, 'cannot be negative'],
  ])('refuses bad input with a clear message (%#)', (input, text) => {
    const r = planSchema.safeParse(input);
    expect(r.success).toBe(false);
    expect(r.error?.issues.map((i) => i.message).join(' | ')).toContain(text);
  });
});
