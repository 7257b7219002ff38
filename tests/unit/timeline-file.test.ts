import { describe, expect, it } from 'vitest';
import { importPreview, importRefusal, readTimelineFile } from '~/lib/editor/timeline-file';
import { timelineToCsv } from '~/lib/timeline/timeline-csv';
import type { Timeline } from '~/lib/timeline/timeline-schema';

// Invented marks.
const current: Timeline = {
  segments: [
    { id: 'a', kind: 'warmup', startSeconds: 0, endSeconds: 60 },
    { id: 'b', kind: 'work', startSeconds: 60, endSeconds: 100, exercise: 'Squat' },
    { id: 'c', kind: 'rest', startSeconds: 100, endSeconds: 120 },
  ],
  cues: [{ id: 'k', atSeconds: 97, kind: 'countdown', text: '3, 2, 1' }],
};

describe('timeline files in the editor', () => {
  it('counts what replacing the marks with a file would change', () => {
    const file: Timeline = {
      segments: [
        { id: 'a', kind: 'warmup', startSeconds: 0, endSeconds: 60 }, // same
        { id: 'b', kind: 'work', startSeconds: 61, endSeconds: 100, exercise: 'Squat' }, // moved
        { id: 'd', kind: 'cooldown', startSeconds: 120, endSeconds: 180 }, // added
      ],
      cues: [], // c and k removed
    };
    const read = readTimelineFile(timelineToCsv(file));
    expect(read.ok).toBe(true);
    expect(importPreview(current, read.ok ? read.timeline : current)).toEqual({ segments: 3, cues: 0, added: 1, removed: 2, moved: 1 });
    expect(importPreview(current, current)).toEqual({ segments: 3, cues: 1, added: 0, removed: 0, moved: 0 });
  });

  it.each([
    ['an empty file', '', 'Nothing was imported: The file is empty. Export a timeline as CSV or WebVTT and import that.'],
    ['a bare WEBVTT header', 'WEBVTT\n', /^Nothing was imported: The file has no segments, so importing it would empty the timeline/],
    ['a CSV with only its header', 'type,id,kind,start,end\n', /^Nothing was imported: The file has no segments/],
  ])('refuses %s with a message that says so', (_what, text, message) => {
    const read = readTimelineFile(text);
    expect(read.ok).toBe(false);
    if (!read.ok) expect(importRefusal(read.errors)).toMatch(message);
  });
});
