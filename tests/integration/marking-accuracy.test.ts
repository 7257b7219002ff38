/**
 * "Mark it for me" accuracy on generated recordings with known truth. The class, the coach's
 * drift, the music, the chatter and the voices are invented for the test (see
 * lib/media/class-soundtrack.ts): the same class three ways — timer beeps, whistle only, spoken
 * count only — each with a music bed and room chatter, every part off by up to ±1.5 s, one round
 * break 8 s long, and 20 s of talk before the warm-up. The audio goes through the real path:
 * espeak-ng voices, AAC encoding with ffmpeg, the analysis decode with ffmpeg.
 * The thresholds are the product's targets (issue 13), not outside figures.
 */
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { proposeTimeline } from '~/lib/marking/propose-timeline';
import { scoreSoundtrack, type ChangeSignal } from '~/lib/media/class-soundtrack';
import { expandPlan } from '~/lib/plan/expand-plan';
import { checkTiming } from '~/lib/timing/timing-check';
import { analyzeRecordingAudio } from '~/server/media/analyze-recording-audio';
import { renderSoundtrack } from '~/server/media/render-soundtrack';
import { ACCURACY_PLAN, matchedShare } from '../helpers/marking-fixtures';

let dir = '';
const clips = new Map<string, Float32Array>();
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'roundmark-marking-'));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

const cases: [ChangeSignal, number][] = [
  ['beeps', 0.97],
  ['whistle', 0.95],
  ['count', 0.8],
];

describe.each(cases)('a class marked by %s', (signal, target) => {
  it(`matches at least ${target * 100} % of the true boundaries within 0.5 s`, { timeout: 300_000 }, async () => {
    const score = scoreSoundtrack(expandPlan(ACCURACY_PLAN).segments, { signal, seed: 42 });
    const file = join(dir, `${signal}.m4a`);
    await renderSoundtrack(score, file, { clips });
    const { events } = await analyzeRecordingAudio(file);
    const proposal = proposeTimeline(ACCURACY_PLAN, events, score.durationSeconds);
    expect(proposal.boundaries).toHaveLength(score.boundaries.length);
    const share = matchedShare(score.boundaries, proposal.boundaries.map((b) => b.atSeconds));
    console.info(`${signal}: ${(share * 100).toFixed(1)} % of ${score.boundaries.length} boundaries within 0.5 s`);
    expect(share).toBeGreaterThanOrEqual(target);
    if (signal === 'beeps') {
      // Saved as the timeline, the proposal passes the same timing check the server runs.
      const result = checkTiming(ACCURACY_PLAN, { segments: proposal.segments, cues: proposal.cues }, { mediaSeconds: score.durationSeconds });
      expect(result.findings.filter((f) => f.severity === 'error')).toEqual([]);
      expect(proposal.cues.filter((c) => c.kind === 'countdown')).toHaveLength(score.boundaries.length);
    }
  });
});
