import { describe, expect, it } from 'vitest';
import { computePeaks, type Peaks } from '~/lib/media/peaks';
import { findOnsets, snapToNearest } from '~/lib/media/onsets';

const TOLERANCE = 0.05; // issue 5: each onset found within 50 ms

/** Deterministic white noise (a small LCG) so tests never depend on Math.random. */
function noise(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32 - 0.5;
  };
}

/** Signal at 8 kHz: noise at `noiseAmp`, plus 1 kHz bursts of `toneAmp` for `toneSeconds` at `times`. */
function synth(durationSeconds: number, times: number[], opts: { noiseAmp?: number; toneAmp?: number; toneSeconds?: number } = {}): Float32Array {
  const sr = 8000;
  const out = new Float32Array(Math.round(durationSeconds * sr));
  const rnd = noise(7);
  for (let i = 0; i < out.length; i++) out[i] = 2 * (opts.noiseAmp ?? 0.003) * rnd();
  for (const t of times) {
    const start = Math.round(t * sr);
    const end = Math.min(out.length, start + Math.round((opts.toneSeconds ?? 0.15) * sr));
    for (let i = start; i < end; i++) out[i] = out[i]! + (opts.toneAmp ?? 0.5) * Math.sin((2 * Math.PI * 1000 * (i - start)) / sr);
  }
  return out;
}

function expectMatches(found: number[], expected: number[]) {
  expect(found).toHaveLength(expected.length);
  expected.forEach((t, i) => expect(Math.abs(found[i]! - t)).toBeLessThanOrEqual(TOLERANCE));
}

function stepPeaks(levels: number[], rate = 100): Peaks {
  return { rate, min: Float32Array.from(levels, (v) => -v), max: Float32Array.from(levels) };
}

describe('findOnsets', () => {
  it('finds tones at irregular times over -44 dBFS noise, each within 50 ms', () => {
    const times = [0.8, 2.35, 2.9, 5.123, 9.5, 11.01];
    const peaks = computePeaks(synth(12, times), 8000, 100);
    expectMatches(findOnsets(peaks), times);
  });

  it('finds a tone at the very start of the file', () => {
    const times = [0, 3];
    expectMatches(findOnsets(computePeaks(synth(5, times), 8000, 100)), times);
  });

  it('finds claps: 20 ms bursts of loud noise', () => {
    const sr = 8000;
    const signal = synth(6, []);
    const rnd = noise(99);
    const claps = [1.5, 3.2, 4.75];
    for (const t of claps) for (let i = 0; i < 0.02 * sr; i++) signal[Math.round(t * sr) + i] = 0.8 * rnd();
    expectMatches(findOnsets(computePeaks(signal, sr, 100)), claps);
  });

  it('reports nothing in steady noise or steady loud sound', () => {
    expect(findOnsets(computePeaks(synth(10, [], { noiseAmp: 0.003 }), 8000, 100)).filter((t) => t > 0)).toEqual([]);
    // A steady level only "starts" at 0 s; no later onsets.
    expect(findOnsets(stepPeaks(new Array(1000).fill(0.3)))).toEqual([0]);
  });

  it('ignores rises smaller than riseDb (6 dB bump in a 12 dB detector)', () => {
    const levels = new Array(600).fill(0.1);
    for (let i = 300; i < 320; i++) levels[i] = 0.2; // +6 dB
    expect(findOnsets(stepPeaks(levels)).filter((t) => t > 0)).toEqual([]);
  });

  it('ignores sounds quieter than minLevelDb even when they rise far above silence', () => {
    const levels = new Array(600).fill(0.0001); // -80 dBFS
    for (let i = 300; i < 320; i++) levels[i] = 0.005; // -46 dBFS: +34 dB, but below -40 dBFS
    expect(findOnsets(stepPeaks(levels))).toEqual([]);
    expect(findOnsets(stepPeaks(levels), { minLevelDb: -50 })).toEqual([3]);
  });

  it('keeps the minimum gap: a double clap 0.1 s apart is one onset', () => {
    const levels = new Array(500).fill(0.003);
    for (const at of [200, 210, 400]) for (let i = at; i < at + 3; i++) levels[i] = 0.6;
    expect(findOnsets(stepPeaks(levels))).toEqual([2, 4]);
    expect(findOnsets(stepPeaks(levels), { minGapSeconds: 0.05 })).toEqual([2, 2.1, 4]);
  });

  it('uses the local floor: a tone in a loud passage needs to rise above that passage', () => {
    const levels = new Array(1000).fill(0.003);
    for (let i = 300; i < 700; i++) levels[i] = 0.1; // loud music from 3 s to 7 s
    levels[500] = 0.15; // +3.5 dB over the music: not an onset
    for (let i = 600; i < 610; i++) levels[i] = 0.9; // +19 dB over the music: an onset
    expect(findOnsets(stepPeaks(levels))).toEqual([3, 6]);
  });

  it('handles 90 minutes of peaks quickly (the editor runs it in the browser)', () => {
    const n = 90 * 60 * 100;
    const levels = new Array<number>(n).fill(0.003);
    for (let s = 30; s < 90 * 60; s += 40) for (let i = 0; i < 15; i++) levels[s * 100 + i] = 0.5;
    const started = performance.now();
    const onsets = findOnsets(stepPeaks(levels));
    const elapsed = performance.now() - started;
    expect(onsets).toHaveLength(Math.ceil((90 * 60 - 30) / 40));
    expect(elapsed).toBeLessThan(2000);
  });
});

describe('snapToNearest', () => {
  it.each([
    [10.02, [5, 10, 15], 0.1, 10],
    [10.2, [5, 10, 15], 0.1, 10.2], // none close enough: unchanged
    [10.1, [5, 10, 15], 0.1, 10], // exactly at maxDistance snaps
    [12.5, [15, 10], 2.5, 10], // tie: the earlier candidate wins, order of candidates does not matter
    [12.5, [10, 15], 2.5, 10],
    [7, [], 1, 7],
    [3.04, [3.1, 2.99], 0.5, 2.99],
  ])('snaps %f among %j within %f to %f', (time, candidates, max, expected) => {
    expect(snapToNearest(time, candidates, max)).toBe(expected);
  });
});
