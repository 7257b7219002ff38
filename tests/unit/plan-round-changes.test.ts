import { describe, expect, it } from 'vitest';
import { evenStations } from '~/lib/plan/even-stations';
import { expandPlan } from '~/lib/plan/expand-plan';
import { blockPlannedSeconds, planSchema } from '~/lib/plan/plan-schema';
import { messagesByPath } from '~/lib/plan/plan-editing';
import { checkTiming } from '~/lib/timing/timing-check';
import { codes, plan, timelineFromPlan, without } from './timing-fixtures';

// Ladder arithmetic worked by hand (invented plan, not demo data): 2 stations, 3 rounds,
// 20 s rests, 60 s round break, work 30/40/50 s in rounds 1/2/3, default options.
// Round 1: A 30, rest 20, B 30 (break replaces B's rest), break 60  = 140
// Round 2: A 40, rest 20, B 40, break 60                            = 160
// Round 3: A 50, rest 20, B 50 (final rest dropped)                 = 120
// Total 420 s, of which work 2 × (30 + 40 + 50) = 240 s.
const ladder = plan({
  blocks: [
    {
      kind: 'circuit',
      rounds: 3,
      roundBreakSeconds: 60,
      stations: evenStations(['A', 'B'], 30, 20),
      roundChanges: [{ round: 2, workSeconds: 40 }, { round: 3, workSeconds: 50 }],
    },
  ],
});

describe('ladders and pyramids', () => {
  it('expands the ladder as worked by hand', () => {
    const s = expandPlan(ladder);
    expect(s.totals.classSeconds).toBe(420);
    expect(s.totals.workSeconds).toBe(240);
    expect(s.segments.filter((x) => x.kind === 'work').map((x) => `${x.exercise}${x.round}:${x.seconds}`)).toEqual([
      'A1:30', 'B1:30', 'A2:40', 'B2:40', 'A3:50', 'B3:50',
    ]);
    expect(blockPlannedSeconds(ladder.blocks[0]!, ladder.options)).toBe(420);
  });

  it('a pyramid changes rest as well as work', () => {
    // 1 station, 3 rounds, no break, options off (every rest kept): 30+10, 45+15, 30+10 = 140 s.
    const p = plan({
      blocks: [{ kind: 'circuit', rounds: 3, stations: [{ exercise: 'P', workSeconds: 30, restSeconds: 10 }], roundChanges: [{ round: 2, workSeconds: 45, restSeconds: 15 }] }],
      options: { roundBreakReplacesLastRest: false, dropFinalRest: false },
    });
    expect(expandPlan(p).totals.classSeconds).toBe(140);
  });
});

describe('a round leaving out a station', () => {
  // 3 stations × (40 + 20) × 2 rounds, 30 s break; round 2 leaves out station 2.
  const base = {
    kind: 'circuit' as const,
    rounds: 2,
    roundBreakSeconds: 30,
    stations: ['A', 'B', 'C'].map((exercise) => ({ exercise, workSeconds: 40, restSeconds: 20 })),
  };
  const skipping = plan({ blocks: [{ ...base, roundChanges: [{ round: 2, skipStations: [2] }] }] });

  it('drops the station and its rest from that round only', () => {
    const work = expandPlan(skipping).segments.filter((x) => x.kind === 'work').map((x) => `${x.exercise}${x.round}`);
    expect(work).toEqual(['A1', 'B1', 'C1', 'A2', 'C2']);
    // Round 1: 40+20+40+20+40 = 160, break 30; round 2: 40+20+40 = 100. Total 290.
    expect(expandPlan(skipping).totals.classSeconds).toBe(290);
  });

  it('a recording without that station checks clean once the plan leaves it out', () => {
    const full = plan({ blocks: [base] });
    const marks = timelineFromPlan(full);
    // Take B of round 2 and its rest out of the marks, closing the gap (as a class that skipped it).
    const ids = marks.segments.filter((s) => s.round === 2 && (s.exercise === 'B' || (s.kind === 'rest' && marks.segments[marks.segments.indexOf(s) - 1]?.exercise === 'B'))).map((s) => s.id);
    const cut = without(marks, ...ids);
    const before = checkTiming(full, cut, { mediaSeconds: 1000 });
    expect(codes(before.findings)).toContain('missing-station');
    const after = checkTiming(skipping, timelineFromPlan(skipping), { mediaSeconds: 1000 });
    expect(after.findings).toEqual([]);
  });
});

describe('round change messages (the schema\'s words)', () => {
  const fields = (input: unknown) => {
    const r = planSchema.safeParse(input);
    return r.success ? {} : messagesByPath(r.error.issues);
  };
  const circuit = (roundChanges: unknown) => ({ blocks: [{ kind: 'circuit', rounds: 2, stations: [{ exercise: 'A', workSeconds: 30, restSeconds: 10 }, { exercise: 'B', workSeconds: 30, restSeconds: 10 }], roundChanges }] });
  it.each([
    [[{ round: 3 }], 'blocks.0.roundChanges.0.round', "Round 3 is past the circuit's 2 rounds."],
    [[{ round: 1 }, { round: 1 }], 'blocks.0.roundChanges.1.round', 'Round 1 is changed twice; keep one change per round.'],
    [[{ round: 1, skipStations: [3] }], 'blocks.0.roundChanges.0.skipStations', "Station 3 is past the circuit's 2 stations."],
    [[{ round: 2, skipStations: [1, 2] }], 'blocks.0.roundChanges.0.skipStations', 'Round 2 cannot leave out every station; lower the number of rounds instead.'],
    [[{ round: 0 }], 'blocks.0.roundChanges.0.round', 'Rounds are numbered from 1.'],
    [[{ round: 1, workSeconds: 0 }], 'blocks.0.roundChanges.0.workSeconds', 'Work must be more than 0 seconds.'],
  ])('%j → %s: %s', (changes, path, message) => {
    expect(fields(circuit(changes))[path]).toBe(message);
  });
});
