// Desk-Break Mobility's demo captions (invented demo content) follow the demo recording's own
// soundtrack: every line the generated coach (or the room) speaks has a caption starting when it
// is spoken, with its words; the captions are valid for the save and end inside the recording.
import { describe, expect, it } from 'vitest';
import { captionCuesSchema, captionsPastRecording } from '~/lib/captions/caption-schema';
import { expandPlan } from '~/lib/plan/expand-plan';
import { planSchema } from '~/lib/plan/plan-schema';
import { captionText, demoCaptions } from '~/scripts/demo/demo-captions';
import { DEMO_FPS, demoSoundtrackScore, demoSpans } from '~/scripts/demo/demo-spans';
import { demoTimeline } from '~/scripts/demo/demo-timelines';
import { lessons } from '~/scripts/demo/fernhill';

const desk = lessons.find((l) => l.slug === 'desk-break-mobility')!;
const timeline = demoTimeline(expandPlan(planSchema.parse(desk.plan)));
// The seed's and the demo recording job's media length: the end of the last marked segment.
const mediaSeconds = Math.max(...timeline.segments.map((s) => s.endSeconds));
const plain = (text: string) => text.toLowerCase().replace(/[^a-z0-9 ]/g, '').trim();

describe('Desk-Break Mobility demo captions', () => {
  const signal = desk.changeSignal!;
  const score = demoSoundtrackScore(demoSpans(timeline.segments, mediaSeconds), DEMO_FPS, signal);
  const cues = demoCaptions(timeline, mediaSeconds, signal);

  it('is captioned and counts out loud (so its count is captioned too)', () => {
    expect(desk.captioned).toBe(true);
    expect(signal).toBe('count');
    expect(score.lines.filter((l) => l.text === 'three')).not.toHaveLength(0);
  });

  it('has a caption for every spoken line, at the time it is spoken, with its words', () => {
    expect(score.lines.length).toBeGreaterThan(20);
    for (const line of score.lines) {
      const at = cues.filter((c) => Math.abs(c.startSeconds - line.atSeconds) <= 0.0005);
      expect(at.map((c) => c.text), `line "${line.text}" at ${line.atSeconds} s`).toContain(captionText(line));
      expect(at.some((c) => plain(c.text).endsWith(plain(line.text)))).toBe(true);
      // Still on screen while the line is said (it lasts until the next coach line at most).
      const cue = at.find((c) => c.text === captionText(line))!;
      expect(cue.endSeconds).toBeGreaterThan(line.atSeconds);
    }
    // Nothing invented beside the spoken lines except the one sound cue for the music.
    expect(cues.filter((c) => c.text.startsWith('[Music'))).toHaveLength(1);
    expect(cues).toHaveLength(score.lines.length + 1);
  });

  it('passes the captions save rules and ends inside the recording', () => {
    expect(captionCuesSchema.safeParse(cues).success).toBe(true);
    expect(captionsPastRecording(cues, mediaSeconds)).toEqual({});
    expect(Math.max(...cues.map((c) => c.endSeconds))).toBeLessThanOrEqual(mediaSeconds - 0.5);
  });

  it('is the same every time (the score is seeded from the class)', () => {
    expect(demoCaptions(timeline, mediaSeconds, signal)).toEqual(cues);
  });
});
