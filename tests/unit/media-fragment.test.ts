import { describe, expect, it } from 'vitest';
import { parseTemporalFragment, temporalFragment } from '~/lib/publishing/media-fragment';

// Cases from the W3C Media Fragments URI 1.0 test cases (temporal dimension), as listed in
// shared/check-values.md: t=3 is 3 s to the end; t=,7 is 0–7 s; t=, is a syntax error;
// t=3,3 and t=7,3 are invalid (empty or reversed range).
describe('W3C Media Fragments 1.0 temporal dimension', () => {
  it.each([
    ['t=3', { start: 3, end: null }],
    ['t=,7', { start: 0, end: 7 }],
    ['t=3,7', { start: 3, end: 7 }],
    ['t=npt:10.5', { start: 10.5, end: null }],
    ['t=1:30', { start: 90, end: null }],
    ['t=0:02:00,0:02:30', { start: 120, end: 150 }],
    ['#t=90', { start: 90, end: null }],
    ['xywh=1,2,3,4&t=5', { start: 5, end: null }],
  ])('%s parses', (fragment, expected) => {
    expect(parseTemporalFragment(fragment)).toEqual(expected);
  });

  it.each(['t=,', 't=3,3', 't=7,3', 't=', 't=abc', 't=1:75', 't=1,2,3', 'x=3'])('%s is refused', (fragment) => {
    expect(parseTemporalFragment(fragment)).toBeNull();
  });

  it('writes chapter starts that read back to the millisecond', () => {
    for (const s of [0, 15, 254.5, 1749.999]) expect(parseTemporalFragment(temporalFragment(s))).toEqual({ start: s, end: null });
  });
});
