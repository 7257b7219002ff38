/**
 * Editor-level snapping on real audio: ffmpeg generates 1 kHz tones at known times (aevalsrc,
 * gated to the sample), our peaks and onset finder read them, and rough marks snap onto each
 * tone within 50 ms (issue 5). The finder itself is covered in onsets.test.ts and
 * media-pipeline.test.ts; this file covers what the editor does with its output.
 */
import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import { beforeAll, describe, expect, it } from 'vitest';
import { computePeaks, type Peaks } from '~/lib/media/peaks';
import { findOnsets } from '~/lib/media/onsets';
import { edgeTargets, nearestSorted, planAnchor, plannedBoundaries, plannedLengthOf, snapTime } from '~/lib/editor/snapping';
import { editorReducer, initialEditorState } from '~/lib/editor/editor-state';
import { planSchema } from '~/lib/plan/plan-schema';

const run = promisify(execFile);
const TOLERANCE = 0.05; // issue 5: within 50 ms
const TONES = [2.0, 4.75, 7.5, 11.25, 13.8];
const SR = 8000;

let peaks: Peaks;
let onsets: number[];

beforeAll(async () => {
  const gates = TONES.map((t) => `between(t\\,${t}\\,${(t + 0.15).toFixed(3)})`).join('+');
  // Quiet pink-ish noise under the tones, like a room, plus the tones: raw 16-bit PCM on stdout.
  const { stdout } = await run(
    'ffmpeg',
    ['-hide_banner', '-loglevel', 'error', '-f', 'lavfi', '-i', `aevalsrc=0.5*sin(2*PI*1000*t)*(${gates})+0.004*(random(0)-0.5):s=${SR}:d=16`, '-f', 's16le', '-ac', '1', '-'],
    { encoding: 'buffer', maxBuffer: 64 * 1024 * 1024 },
  );
  const buf = stdout as unknown as Buffer;
  const samples = new Int16Array(buf.buffer, buf.byteOffset, buf.byteLength / 2);
  peaks = computePeaks(samples, SR, 100);
  onsets = findOnsets(peaks);
});

describe('snapping marks to the recording', () => {
  it('finds every ffmpeg tone within 50 ms', () => {
    expect(onsets).toHaveLength(TONES.length);
    TONES.forEach((t, i) => expect(Math.abs(onsets[i]! - t)).toBeLessThanOrEqual(TOLERANCE));
  });

  it.each(TONES.map((t, i) => [t, i % 2 === 0 ? 0.22 : -0.18]))('a rough mark near the tone at %s s (off by %s s) snaps onto it', (tone, offset) => {
    const snapped = snapTime(tone + offset, { onsets, planned: [] }, { enabled: true, maxDistance: 0.3 });
    expect(snapped.source).toBe('onset');
    expect(Math.abs(snapped.time - tone)).toBeLessThanOrEqual(TOLERANCE);
  });

  it('leaves the mark alone when snapping is off, bypassed, or nothing is close', () => {
    expect(snapTime(4.5, { onsets, planned: [] }, { enabled: false, maxDistance: 0.3 })).toEqual({ time: 4.5, source: null });
    expect(snapTime(4.5, { onsets, planned: [] }, { enabled: true, bypass: true, maxDistance: 0.3 })).toEqual({ time: 4.5, source: null });
    expect(snapTime(9.3, { onsets, planned: [] }, { enabled: true, maxDistance: 0.3 })).toEqual({ time: 9.3, source: null });
  });

  it('splits at a snapped playhead: the new boundary lands on the tone', () => {
    const s0 = initialEditorState({ segments: [{ id: 'w', kind: 'work', startSeconds: 0, endSeconds: 16 }], cues: [] }, 16);
    const at = snapTime(7.62, { onsets, planned: [] }, { enabled: true, maxDistance: 0.3 }).time;
    const s1 = editorReducer(s0, { type: 'split', at });
    expect(Math.abs(s1.timeline.segments[1]!.startSeconds - 7.5)).toBeLessThanOrEqual(TOLERANCE);
  });
});

describe('snapping to the plan', () => {
  // A common circuit format: 45 s work + 15 s rest (common practice, no source).
  const plan = planSchema.parse({
    blocks: [{ kind: 'warmup', seconds: 60 }, { kind: 'circuit', rounds: 1, stations: [{ exercise: 'Goblet squat', workSeconds: 45, restSeconds: 15 }, { exercise: 'Plank', workSeconds: 45, restSeconds: 15 }] }],
  });
  const timeline = {
    segments: [
      { id: 'wu', kind: 'warmup' as const, startSeconds: 12, endSeconds: 72 },
      { id: 'w1', kind: 'work' as const, startSeconds: 72, endSeconds: 110, exercise: 'Goblet squat', round: 1 },
    ],
    cues: [],
  };

  it('anchors the plan at the first warm-up and lists its boundaries', () => {
    expect(planAnchor(plan, timeline)).toBe(12);
    expect(plannedBoundaries(plan, 12)).toEqual([12, 72, 117, 132, 177]);
  });

  it('snaps a dragged end to the planned length of that station, and prefers an onset on a tie', () => {
    expect(plannedLengthOf(plan, timeline.segments[1]!)).toBe(45);
    const targets = edgeTargets(plan, timeline, 'w1', 'end', [], plannedBoundaries(plan, 12));
    expect(snapTime(116.2, targets, { enabled: true, maxDistance: 1 })).toEqual({ time: 117, source: 'plan' });
    expect(snapTime(10, { onsets: [10.5], planned: [9.5] }, { enabled: true, maxDistance: 1 }).source).toBe('onset');
  });

  it('finds the nearest value in a sorted list', () => {
    expect(nearestSorted([], 3)).toBeUndefined();
    expect(nearestSorted([1, 4, 9], 6)).toBe(4);
    expect(nearestSorted([1, 4, 9], 7)).toBe(9);
    expect(nearestSorted([1, 4, 9], 100)).toBe(9);
  });
});
