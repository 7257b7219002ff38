import { describe, expect, it } from 'vitest';
import { WebVTTParser } from 'webvtt-parser';
import { captionsPastRecording, captionsPutSchema, MAX_CAPTION_CUES, trimCaptionsToRecording, type CaptionCue } from '~/lib/captions/caption-schema';
import { captionFileFormat, captionsFromFile, captionsToVtt } from '~/lib/captions/captions-vtt';

/**
 * A hand-written SubRip file in the format's usual layout: a counter line, a timing line
 * `hh:mm:ss,mmm --> hh:mm:ss,mmm` with a comma before the milliseconds, the text (one or two
 * lines), a blank line between blocks, CRLF line ends as Windows tools write them. SubRip has no
 * formal specification: this layout is common practice, no source. Times and words invented.
 */
const SRT = [
  '1', '00:00:01,250 --> 00:00:04,000', 'Welcome in, find a spot', 'with room to reach out.', '',
  '2', '00:00:04,500 --> 00:00:06,750', '<i>[timer beeps]</i>', '',
  '3', '00:01:02,005 --> 00:01:05,100', 'Roll the shoulders back & down.', '',
  '4', '01:00:00,000 --> 01:00:01,500', 'One hour in.', '',
].join('\r\n');

const cue = (startSeconds: number, endSeconds: number, text: string): CaptionCue => ({ startSeconds, endSeconds, text });

describe('caption files', () => {
  it('reads a hand-written SRT example exactly (SubRip: common practice, no formal spec)', () => {
    const result = captionsFromFile(SRT);
    expect(result).toEqual({
      ok: true,
      format: 'srt',
      cues: [
        cue(1.25, 4, 'Welcome in, find a spot\nwith room to reach out.'),
        cue(4.5, 6.75, '[timer beeps]'),
        cue(62.005, 65.1, 'Roll the shoulders back & down.'),
        cue(3600, 3601.5, 'One hour in.'),
      ],
    });
  });

  it('reads WebVTT with markup and character references as plain text', () => {
    const vtt = 'WEBVTT\n\nintro\n00:01.000 --> 00:03.500 align:start\n<v Ada>Hold it &amp; <i>breathe</i></v>\n\n00:04.000 --> 00:05.000\nRest &lt;now&gt;\n';
    expect(captionsFromFile(vtt)).toEqual({ ok: true, format: 'vtt', cues: [cue(1, 3.5, 'Hold it & breathe'), cue(4, 5, 'Rest <now>')] });
  });

  it('writes a captions file the spec-following parser reads back exactly (W3C WebVTT §4.1)', () => {
    const cues = [cue(0.5, 2, 'a < b & c'), cue(2, 3.25, 'two\nlines'), cue(3599.999, 3723.004, 'past an hour')];
    const vtt = captionsToVtt(cues);
    // webvtt-parser 2.2.0 implements the W3C WebVTT parsing algorithm (https://www.w3.org/TR/webvtt1/).
    const parsed = new WebVTTParser().parse(vtt);
    expect(parsed.errors).toEqual([]);
    expect(parsed.cues.map((c) => [c.startTime, c.endTime])).toEqual(cues.map((c) => [c.startSeconds, c.endSeconds]));
    expect(vtt).toContain('00:00.500 --> 00:02.000\na &lt; b &amp; c');
    expect(vtt).toContain('59:59.999 --> 01:02:03.004'); // hours only when non-zero (§4.1)
    // Round trip through our own reader.
    expect(captionsFromFile(vtt)).toEqual({ ok: true, format: 'vtt', cues });
  });

  it('tells the formats apart from the first lines only', () => {
    expect(captionFileFormat('\uFEFFWEBVTT\n\n')).toBe('vtt');
    expect(captionFileFormat('WEBVTTX\n')).toBeUndefined();
    expect(captionFileFormat('1\n00:00:01.000 --> 00:00:02.000\nx')).toBe('srt');
    expect(captionFileFormat('start,end,kind\n1,2,work')).toBeUndefined();
  });

  it.each([
    ['empty', '  \n', /The file is empty/],
    ['neither format', 'start,end,text\n0,1,hi\n', /not a caption file/],
    ['WebVTT without cues', 'WEBVTT\n\n', /no captions/],
    ['a broken timing line', 'WEBVTT\n\n00:01.000 -> 00:02.000\nhi\n', /problem on line 4: Cue identifier needs to be followed by timestamp/], // the parser reads the bad line as an identifier,
    ['cues going backwards (W3C WebVTT §4.1)', 'WEBVTT\n\n00:05.000 --> 00:06.000\nb\n\n00:01.000 --> 00:02.000\na\n', /problem on line/],
    ['an empty cue', '1\n00:00:01,000 --> 00:00:02,000\n<i></i>\n\n2\n00:00:03,000 --> 00:00:04,000\nok\n', /Caption 1 .*needs text/],
  ])('refuses %s with a message and no cues', (_name, text, message) => {
    const result = captionsFromFile(text);
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.message).toMatch(message);
  });

  it(`refuses more than ${MAX_CAPTION_CUES} captions`, () => {
    // Invented: one-second captions, one more than the limit.
    const cues = Array.from({ length: MAX_CAPTION_CUES + 1 }, (_, i) => cue(i, i + 1, `line ${i}`));
    const result = captionsFromFile(captionsToVtt(cues));
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.message).toMatch(/at most 10,000 captions/);
  });

  it('refuses control characters, "-->" and blank lines in a caption, and reversed times, at the field', () => {
    const body = (cues: unknown[]) => ({ version: 0, language: 'en', label: 'English captions', cues });
    const bad = captionsPutSchema.safeParse(body([cue(1, 2, 'nul\u0000here'), cue(2, 3, 'a --> b'), cue(3, 4, 'a\n\nb'), cue(5, 4, 'back')]));
    expect(bad.success).toBe(false);
    const paths = bad.error!.issues.map((i) => i.path.join('.'));
    expect(paths).toEqual(['cues.0.text', 'cues.1.text', 'cues.2.text', 'cues.3.endSeconds']);
    expect(captionsPutSchema.safeParse({ ...body([]), language: 'English' }).success).toBe(false);
    expect(captionsPutSchema.safeParse(body([cue(1, 2, 'ok')])).success).toBe(true);
  });

  it('names each caption that ends after the recording', () => {
    expect(captionsPastRecording([cue(1, 2, 'a'), cue(9, 10.5, 'b')], 10)).toEqual({
      'cues.1.endSeconds': expect.stringMatching(/Caption 2 ends after the recording/),
    });
    expect(captionsPastRecording([cue(9, 10, 'b')], 10)).toEqual({});
  });
});

describe('captions against a shorter recording', () => {
  // Invented cues around a recording that now ends at 10 s.
  const cues: CaptionCue[] = [
    { startSeconds: 1, endSeconds: 4, text: 'inside' },
    { startSeconds: 8, endSeconds: 12, text: 'runs past the end' },
    { startSeconds: 10, endSeconds: 11, text: 'starts at the end' },
    { startSeconds: 11, endSeconds: 13, text: 'after the end' },
  ];

  it('lists each caption past the end by its field', () => {
    expect(Object.keys(captionsPastRecording(cues, 10))).toEqual(['cues.1.endSeconds', 'cues.2.endSeconds', 'cues.3.endSeconds']);
  });

  it('trims to the recording: drops what starts at or after the end, ends the rest at the end', () => {
    const trimmed = trimCaptionsToRecording(cues, 10);
    expect(trimmed).toEqual([cues[0], { startSeconds: 8, endSeconds: 10, text: 'runs past the end' }]);
    expect(captionsPastRecording(trimmed, 10)).toEqual({});
  });
});
