import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readCsv, writeCsv } from '~/lib/timeline/csv-records';
import { timelineFromCsv, timelineToCsv } from '~/lib/timeline/timeline-csv';
import { MAX_SEGMENTS, type Timeline } from '~/lib/timeline/timeline-schema';

const sample: Timeline = {
  segments: [
    { id: 'w1', kind: 'warmup', startSeconds: 0, endSeconds: 240.001 },
    { id: 'k1', kind: 'work', startSeconds: 240.001, endSeconds: 280.5, exercise: 'Goblet squat, heavy', round: 1, title: 'She said "go"' },
    { id: 'k2', kind: 'work', startSeconds: 280.5, endSeconds: 310, exercise: 'Side lunge', round: 1, side: 'left' },
    { id: 'k3', kind: 'work', startSeconds: 310, endSeconds: 1030, format: 'amrap' },
  ],
  cues: [{ id: 'c1', atSeconds: 237.25, kind: 'countdown', text: 'Three,\ntwo, one' }],
};

describe('RFC 4180 records', () => {
  it('quotes commas, quotes and line breaks, and reads them back (RFC 4180 §2 rules 5–7)', () => {
    const rows = [['a', 'b,c', 'd"e', 'f\r\ng'], ['', ' x', 'y']];
    const r = readCsv(writeCsv(rows));
    expect(r.ok && r.records.map((x) => x.fields)).toEqual(rows);
  });
  it('numbers records by the line they start on', () => {
    const r = readCsv('a,b\n"multi\nline",x\n\nlast,y\n');
    expect(r.ok && r.records.map((x) => x.line)).toEqual([1, 2, 5]);
  });
  it.each([
    ['a,"open\n', 1, 'never closed'],
    ['a\nb"c,d\n', 2, 'quote appears inside'],
    ['"a"b,c\n', 1, 'closing quote'],
  ])('refuses %j on line %i', (text, line, message) => {
    const r = readCsv(text);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors[0]).toMatchObject({ line });
    if (!r.ok) expect(r.errors[0]!.message).toContain(message);
  });
});

describe('timeline CSV', () => {
  it('round-trips every field and every millisecond', () => {
    const csv = timelineToCsv(sample);
    expect(csv.split('\r\n')[0]).toBe('type,id,kind,start,end,exercise,round,set,title,text,side,format');
    expect(csv).toContain('4:00.001');
    const back = timelineFromCsv(csv);
    expect(back).toEqual({ ok: true, timeline: sample });
  });

  it('round-trips random times to the millisecond (fast-check)', () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.integer({ min: 0, max: 40_000_000 }), fc.integer({ min: 1, max: 5_000_000 })), { minLength: 1, maxLength: 20 }), (spans) => {
        const t: Timeline = {
          segments: spans.map(([s, len], i) => ({ id: `s${i}`, kind: 'rest', startSeconds: s / 1000, endSeconds: (s + len) / 1000 })),
          cues: [],
        };
        const back = timelineFromCsv(timelineToCsv(t));
        expect(back.ok).toBe(true);
        if (back.ok) {
          const byId = new Map(back.timeline.segments.map((s) => [s.id, s]));
          for (const s of t.segments) expect(byId.get(s.id)).toEqual(s);
        }
      }),
    );
  });

  it('accepts seconds, any column order, a missing type column, and generates missing ids', () => {
    const ok = timelineFromCsv('kind,start,end,text\nwork,60,100.5,\nrest,1:40.5,2:00,\nform,1:05,,Chest up\n');
    expect(ok).toEqual({
      ok: true,
      timeline: {
        segments: [
          { id: 'seg-1', kind: 'work', startSeconds: 60, endSeconds: 100.5, exercise: undefined, round: undefined, set: undefined, title: undefined },
          { id: 'seg-2', kind: 'rest', startSeconds: 100.5, endSeconds: 120, exercise: undefined, round: undefined, set: undefined, title: undefined },
        ],
        cues: [{ id: 'cue-1', kind: 'form', atSeconds: 65, text: 'Chest up' }],
      },
    });
  });

  it.each([
    ['kind,start,end\nwork,1:00,0:50\n', [{ line: 2, message: 'A segment must end after it starts.' }]],
    ['kind,start,end\nwork,1:00,1:30\nsprint,2:00,2:10\n', [{ line: 3, message: '"sprint" is not a segment or cue kind.' }]],
    ['kind,start,end\nwork,1:75,2:00\n', [{ line: 2, message: 'Start: "1:75" has 75 seconds; seconds must be below 60.' }]],
    ['kind,start\nwork,1:00\n', [{ line: 2, message: 'End: The time is empty.' }]],
    ['id,kind,start,end\na,work,0,1\na,rest,1,2\n', [{ line: 3, message: 'The segment id "a" is already used on line 2; ids must be unique.' }]],
    ['kind,begin\n', [{ line: 1, message: 'Unknown column "begin". Columns are: type, id, kind, start, end, exercise, round, set, title, text, side, format.' }, { line: 1, message: 'The header has no "start" column.' }]],
    ['kind,start,end,round\nwork,0,1,two\n', [{ line: 2, message: 'The round must be a number.' }]],
    ['Kind,Start,End\nwork,60,100.5\nform,1:05,\n', [{ line: 3, message: 'A cue needs text.' }]],
  ])('a bad file imports nothing and names the line (%#)', (csv, errors) => {
    expect(timelineFromCsv(csv)).toEqual({ ok: false, errors });
  });
});

describe('import limits (the same as a save)', () => {
  const header = 'type,id,kind,start,end,exercise,round,set,title,text';
  it('refuses more than MAX_SEGMENTS segments, and a file with none', () => {
    // Invented rows of one second each.
    const rows = Array.from({ length: MAX_SEGMENTS + 1 }, (_, i) => `segment,,work,${i},${i + 1},,,,,`);
    const over = timelineFromCsv([header, ...rows].join('\n'));
    expect(over.ok).toBe(false);
    if (!over.ok) expect(over.errors[0]).toEqual({ line: 0, message: expect.stringMatching(/has 5001 segments; a timeline holds at most 5000/) });
    const exactly = timelineFromCsv([header, ...rows.slice(0, MAX_SEGMENTS)].join('\n'));
    expect(exactly.ok).toBe(true);
    const none = timelineFromCsv(header + '\n');
    expect(none.ok).toBe(false);
    if (!none.ok) expect(none.errors[0]!.message).toMatch(/no segments/);
  });
});
