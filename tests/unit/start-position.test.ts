import { describe, expect, it } from 'vitest';
import { startPosition, type StartInput } from '~/lib/publishing/start-position';

const base: StartInput = { fragmentStart: null, navigation: 'navigate', savedSeconds: 0, durationSeconds: 600, finished: false };

// The resume rule of src/lib/publishing/start-position.ts (our own rule, documented there and in DEVELOPERS.md).
describe('where the player starts', () => {
  it.each([
    ['fresh link with #t=, nothing saved', { fragmentStart: 45 }, { seekTo: 45, offerResumeAt: null }],
    ['fresh link with #t= wins over a saved position', { fragmentStart: 45, savedSeconds: 55 }, { seekTo: 45, offerResumeAt: null }],
    ['reload with the player’s own stale #t=: the saved position wins', { fragmentStart: 45, savedSeconds: 55, navigation: 'reload' }, { seekTo: null, offerResumeAt: 55 }],
    ['back/forward with a stale #t=: the saved position wins', { fragmentStart: 45, savedSeconds: 55, navigation: 'back_forward' }, { seekTo: null, offerResumeAt: 55 }],
    ['reload with a stale #t= and nothing worth resuming: starts at 0', { fragmentStart: 45, savedSeconds: 5, navigation: 'reload' }, { seekTo: null, offerResumeAt: null }],
    ['no fragment, saved position: offered', { savedSeconds: 55 }, { seekTo: null, offerResumeAt: 55 }],
    ['no fragment, saved within 10 s of the start: not offered', { savedSeconds: 10 }, { seekTo: null, offerResumeAt: null }],
    ['no fragment, saved within 10 s of the end: not offered', { savedSeconds: 591 }, { seekTo: null, offerResumeAt: null }],
    ['finished class: not offered', { savedSeconds: 300, finished: true }, { seekTo: null, offerResumeAt: null }],
    ['fragment past the end is clamped', { fragmentStart: 900 }, { seekTo: 600, offerResumeAt: null }],
  ] as [string, Partial<StartInput>, object][])('%s', (_name, change, expected) => {
    expect(startPosition({ ...base, ...change })).toEqual(expected);
  });
});
