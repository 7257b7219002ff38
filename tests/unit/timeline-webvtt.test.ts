import fc from 'fast-check';
import { WebVTTParser } from 'webvtt-parser';
import { describe, expect, it } from 'vitest';
import type { Timeline } from '~/lib/timeline/timeline-schema';
import { chapterLabel, timelineFromWebVtt, timelineToWebVtt } from '~/lib/timeline/timeline-webvtt';

const sample: Timeline = {
  segments: [
    { id: 'intro', kind: 'intro', startSeconds: 0, endSeconds: 12.345 },
    { id: 'w', kind: 'warmup', startSeconds: 12.345, endSeconds: 252.345, title: 'Warm-up & mobility <easy>' },
    { id: 'k1', kind: 'work', startSeconds: 252.345, endSeconds: 292.345, exercise: 'Goblet squat', round: 1 },
    { id: 'r1', kind: 'rest', startSeconds: 292.345, endSeconds: 312.345, round: 1 },
    { id: 'i1', kind: 'work', startSeconds: 312.345, endSeconds: 332.345, exercise: 'Fast feet --> faster', set: 1 },
    { id: 'cd', kind: 'cooldown', startSeconds: 332.345, endSeconds: 3912.5 },
  ],
  cues: [{ id: 'c1', atSeconds: 250.1, kind: 'countdown', text: 'Three, two, one --> go!\nBreathe' }],
};

const exported = (t: Timeline): string => {
  const r = timelineToWebVtt(t);
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r.text;
};

describe('WebVTT chapters export', () => {
  const text = exported(sample);
  const parsed = new WebVTTParser().parse(text, 'chapters');

  // webvtt-parser 2.2.0 follows the W3C WebVTT parsing algorithm; chapters mode flags tags in titles.
  it('parses with no error as a chapters file (webvtt-parser, W3C WebVTT)', () => {
    expect(parsed.errors).toEqual([]);
    expect(parsed.cues).toHaveLength(sample.segments.length);
  });
  it('keeps every time to the millisecond', () => {
    expect(parsed.cues.map((c) => [c.startTime, c.endTime])).toEqual(sample.segments.map((s) => [s.startSeconds, s.endSeconds]));
  });
  it('uses hours only when non-zero (W3C WebVTT §4.1)', () => {
    expect(text).toContain('05:32.345 --> 01:05:12.500');
  });
  it('writes title text only, with character references for & < > (§4.2.3)', () => {
    expect(parsed.cues[1]!.text).toBe('Warm-up &amp; mobility &lt;easy&gt;');
    expect(parsed.cues[2]!.text).toBe(chapterLabel(sample.segments[2]!));
    expect(parsed.cues[2]!.text).toBe('Work: Goblet squat, round 1');
  });
  // The parser does not check these in chapters mode (check-values.md), so assert them here.
  it('has unique cue identifiers that never contain "-->" (§4.1)', () => {
    const ids = parsed.cues.map((c) => c.id);
    expect(new Set(ids).size).toBe(ids.length);
    for (const id of ids) expect(id).not.toContain('-->');
    expect(text.split('\n').filter((l) => l.includes('-->')).every((l) => /^\S+ --> \S+$/.test(l))).toBe(true);
  });
  it('has chapters that never go backwards and only nest or follow (§4.1, §4.5.1)', () => {
    for (let i = 1; i < parsed.cues.length; i++) {
      const a = parsed.cues[i - 1]!;
      const b = parsed.cues[i]!;
      expect(b.startTime).toBeGreaterThanOrEqual(a.startTime);
      expect(b.startTime >= a.endTime || b.endTime <= a.endTime).toBe(true);
    }
  });
  it('allows nested chapters and refuses partly overlapping ones', () => {
    const nested = { ...sample, segments: [...sample.segments, { id: 't', kind: 'talk' as const, startSeconds: 20, endSeconds: 30 }] };
    expect(new WebVTTParser().parse(exported(nested), 'chapters').errors).toEqual([]);
    const overlap = { ...sample, segments: [...sample.segments, { id: 'x', kind: 'talk' as const, startSeconds: 250, endSeconds: 260 }] };
    const r = timelineToWebVtt(overlap);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors[0]).toMatchObject({ segmentId: 'x' });
  });
});

describe('WebVTT round trip', () => {
  it('keeps kind, exercise, round, set, title, ids and cues', () => {
    expect(timelineFromWebVtt(exported(sample))).toEqual({ ok: true, timeline: sample });
  });
  // Stays under the timeline's 24-hour bound: 30 × 2500 s + 10000 s.
  it('keeps random times to the millisecond (fast-check)', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 1, max: 2_500_000 }), { minLength: 1, maxLength: 30 }), fc.integer({ min: 0, max: 10_000_000 }), (lengths, startMs) => {
        let at = startMs;
        const t: Timeline = {
          segments: lengths.map((len, i) => {
            const s = { id: `s${i}`, kind: 'work' as const, startSeconds: at / 1000, endSeconds: (at + len) / 1000 };
            at += len;
            return s;
          }),
          cues: [],
        };
        const text = exported(t);
        expect(new WebVTTParser().parse(text, 'chapters').errors).toEqual([]);
        expect(timelineFromWebVtt(text)).toEqual({ ok: true, timeline: t });
      }),
    );
  });
  it('imports a plain chapters file: kind from the title, ids generated', () => {
    const r = timelineFromWebVtt('\ufeffWEBVTT - chapters\r\n\r\n00:00.000 --> 01:00.000\r\nWarm-up\r\n\r\nch2\r\n01:00.000 --> 01:30.500\r\nRound one\r\n');
    expect(r).toEqual({
      ok: true,
      timeline: {
        segments: [
          { id: 'seg-1', kind: 'warmup', startSeconds: 0, endSeconds: 60, title: 'Warm-up' },
          { id: 'ch2', kind: 'talk', startSeconds: 60, endSeconds: 90.5, title: 'Round one' },
        ],
        cues: [],
      },
    });
  });
  it.each([
    ['WEBVTTX\n\n', [{ line: 1, message: 'A WebVTT file must start with "WEBVTT" on the first line.' }]],
    ['WEBVTT\nKind: chapters\n', [{ line: 2, message: 'Leave a blank line after the "WEBVTT" line.' }]],
    ['WEBVTT\n\n00:00.000 --> 00:10.000\nA\n\n00:10.000 --> 00:05.000\nB\n', [{ line: 6, message: 'A segment must end after it starts.' }]],
    ['WEBVTT\n\n00:10.000 --> 00:20.000\nA\n\n00:05.000 --> 00:08.000\nB\n', [{ line: 6, message: 'This chapter starts before the previous one; chapters must be in time order.' }]],
    ['WEBVTT\n\n00:00.000 --> 00:1.000\nA\n', [{ line: 3, message: 'End: "00:1.000" is not a WebVTT timestamp; write it as mm:ss.ttt or hh:mm:ss.ttt.' }]],
    ['WEBVTT\n\n00:00.000 --> 00:01.000\n<b>Work</b>\n', [{ line: 4, message: 'A chapter title is plain text: remove the tags (<…>).' }]],
    ['WEBVTT\n\nonly-an-id\n\n', [{ line: 3, message: 'A cue identifier must be followed by a timing line "start --> end" on the next line.' }]],
    ['WEBVTT\n\n00:00.000 --> 00:01.000\n\n', [{ line: 3, message: 'This chapter has no title. Add a title line under the timing line.' }]],
    ['WEBVTT\n\na kind=work\n00:00.000 --> 00:01.000\nX\n\na kind=rest\n00:01.000 --> 00:02.000\nY\n', [{ line: 8, message: 'The segment id "a" is already used on line 4; ids must be unique.' }]],
    ['WEBVTT\n\nNOTE cue id=c1 kind=form text=x\n', [{ line: 3, message: 'This cue comment is damaged: it needs id=, at=mm:ss.ttt, kind= and text=.' }]],
  ])('a bad file imports nothing and names the line (%#)', (text, errors) => {
    expect(timelineFromWebVtt(text)).toEqual({ ok: false, errors });
  });
});
