import { describe, expect, it } from 'vitest';
import { alignStations, normaliseExercise, type AlignItem } from '~/lib/timing/align-stations';

const items = (names: string, spacing = 60): AlignItem[] =>
  [...names].map((c, i) => ({ name: c === '?' ? null : c.toLowerCase(), relativeStart: i * spacing }));

/** Renders an alignment as pairs "p:m" with "-" for a gap. */
const render = (planned: string, marked: string, markedItems = items(marked)) =>
  alignStations(items(planned), markedItems).map((s) => `${s.planned < 0 ? '-' : planned[s.planned]}${s.marked < 0 ? '-' : marked[s.marked]}`).join(' ');

describe('alignStations', () => {
  it.each([
    ['ABCDEF', 'ABCDEF', 'AA BB CC DD EE FF'],
    ['ABCDEF', 'ABDEF', 'AA BB C- DD EE FF'], // one missing: later stations stay matched
    ['ABCDEF', 'ABXCDEF', 'AA BB -X CC DD EE FF'], // one extra
    ['ABCDEF', 'BCDEF', 'A- BB CC DD EE FF'], // the first missing
    ['ABC', '', 'A- B- C-'],
    ['', 'AB', '-A -B'],
    ['ABC', 'A?C', 'AA B? CC'], // an unnamed mark matches any station
  ])('%s vs %s', (planned, marked, expected) => {
    expect(render(planned, marked)).toBe(expected);
  });

  it('places a missing set of identical intervals where the marks have a hole', () => {
    // 8 sets every 30 s; the 5th (at 120 s) not marked, later sets at their planned times
    const planned = Array.from({ length: 8 }, (_, i) => ({ name: 'x', relativeStart: i * 30 }));
    const marked = planned.filter((_, i) => i !== 4);
    const steps = alignStations(planned, marked);
    expect(steps.filter((s) => s.marked < 0).map((s) => s.planned)).toEqual([4]);
  });

  it('stays optimal when many stations are missing (band widening)', () => {
    const planned = items('ABCDEFGHIJKLMNOPQRSTUVWXYZ'.repeat(4));
    const marked = planned.filter((_, i) => i % 3 !== 0);
    const steps = alignStations(planned, marked);
    expect(steps.filter((s) => s.planned >= 0 && s.marked >= 0)).toHaveLength(marked.length);
  });

  it('normalises names', () => {
    expect(normaliseExercise('  Goblet   Squat ')).toBe('goblet squat');
    expect(normaliseExercise(undefined)).toBeNull();
  });
});
