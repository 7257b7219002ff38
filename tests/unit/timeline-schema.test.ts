import { describe, expect, it } from 'vitest';
import { cueSchema, segmentSchema, timelinePutSchema } from '~/lib/timeline/timeline-schema';

const seg = { id: 's1', kind: 'work', startSeconds: 10, endSeconds: 50 };

describe('timeline schemas', () => {
  it('round times to milliseconds', () => {
    expect(segmentSchema.parse({ ...seg, startSeconds: 10.00049, endSeconds: 50.0005 })).toMatchObject({ startSeconds: 10, endSeconds: 50.001 });
  });
  it.each([
    [{ ...seg, endSeconds: 10 }, 'A segment must end after it starts.'],
    [{ ...seg, startSeconds: -1 }, 'The start cannot be before the start of the recording (below 0).'],
    [{ ...seg, endSeconds: Number.POSITIVE_INFINITY }, 'The end'],
    [{ ...seg, kind: 'sprint' }, 'The segment kind must be one of: intro, warmup, work, rest, round-break, cooldown, outro, talk.'],
    [{ ...seg, id: 'has space' }, 'An id is 1 to 64 letters'],
    [{ ...seg, id: 'a-->b' }, 'An id is 1 to 64 letters'],
    [{ ...seg, round: 0 }, 'The round starts at 1.'],
    [{ ...seg, title: 'two\nlines' }, 'The title must be one line'],
  ])('refuses %j', (input, message) => {
    const r = segmentSchema.safeParse(input);
    expect(r.success).toBe(false);
    expect(r.error!.issues.map((i) => i.message).join(' | ')).toContain(message);
  });
  it('checks cue kinds and text', () => {
    expect(cueSchema.safeParse({ id: 'c', atSeconds: 1, kind: 'form', text: 'Chest up' }).success).toBe(true);
    expect(cueSchema.safeParse({ id: 'c', atSeconds: 1, kind: 'shout', text: 'x' }).success).toBe(false);
    expect(cueSchema.safeParse({ id: 'c', atSeconds: 1, kind: 'form', text: '  ' }).success).toBe(false);
  });
  it('refuses duplicate ids in a save and needs a version', () => {
    const r = timelinePutSchema.safeParse({ version: 0, segments: [seg, seg], cues: [] });
    expect(r.error!.issues[0]!.message).toBe('Two segments share the id "s1"; ids must be unique.');
    expect(r.error!.issues[0]!.path).toEqual(['segments', 1, 'id']);
    expect(timelinePutSchema.safeParse({ segments: [], cues: [] }).success).toBe(false);
    expect(timelinePutSchema.safeParse({ version: 3, segments: [seg], cues: [] }).success).toBe(true);
  });
});
