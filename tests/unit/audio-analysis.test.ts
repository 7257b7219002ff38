/**
 * Audio analysis on generated signals. Every input here is invented for the test, with known
 * truth: tones, noise and a warbling whistle synthesised sample by sample.
 */
import { describe, expect, it } from 'vitest';
import { analyzeAudio, ANALYSIS_SAMPLE_RATE } from '~/lib/audio/analyze-audio';
import { createFrameFeatureAccumulator, fftSizeFor } from '~/lib/audio/frame-features';

const SR = ANALYSIS_SAMPLE_RATE;

/** Deterministic noise (a linear congruential generator), so runs are repeatable. */
function noise(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32 - 0.5;
  };
}

function signal(seconds: number, sr = SR): Float32Array {
  return new Float32Array(Math.round(seconds * sr));
}

function addTone(x: Float32Array, atSeconds: number, seconds: number, hz: number, amp: number, sr = SR): void {
  const from = Math.round(atSeconds * sr);
  const to = Math.min(x.length, Math.round((atSeconds + seconds) * sr));
  for (let i = from; i < to; i++) x[i] = (x[i] as number) + amp * Math.sin((2 * Math.PI * hz * (i - from)) / sr);
}

describe('tone detection against a pure tone of known frequency and length (invented input)', () => {
  // Bin width = sample rate / FFT size (definition of the DFT's frequency resolution).
  const binHz = SR / fftSizeFor(SR);
  it.each([
    [523.25, 2.3, 0.4],
    [1000, 5.017, 0.25],
    [2750, 1.0, 1.2],
    [3950, 7.5, 0.15],
  ])('%f Hz at %f s for %f s: frequency within one bin, start within 20 ms, length within 40 ms', (hz, at, seconds) => {
    const x = signal(10);
    addTone(x, at, seconds, hz, 0.25);
    const tones = analyzeAudio(x, SR).filter((e) => e.kind === 'tone');
    expect(tones).toHaveLength(1);
    const tone = tones[0]!;
    expect(Math.abs(tone.frequencyHz! - hz)).toBeLessThanOrEqual(binHz);
    expect(Math.abs(tone.atSeconds - at)).toBeLessThanOrEqual(0.02);
    expect(Math.abs(tone.durationSeconds - seconds)).toBeLessThanOrEqual(0.04);
  });

  it('finds a quiet beep under broadband noise', () => {
    const x = signal(6);
    const n = noise(7);
    for (let i = 0; i < x.length; i++) x[i] = 0.05 * n();
    addTone(x, 3.21, 0.2, 880, 0.2);
    const tones = analyzeAudio(x, SR).filter((e) => e.kind === 'tone');
    expect(tones).toHaveLength(1);
    expect(Math.abs(tones[0]!.atSeconds - 3.21)).toBeLessThanOrEqual(0.02);
  });

  it('hears no tone in noise alone', () => {
    const x = signal(6);
    const n = noise(11);
    for (let i = 0; i < x.length; i++) x[i] = 0.2 * n();
    expect(analyzeAudio(x, SR).filter((e) => e.kind === 'tone' || e.kind === 'whistle')).toEqual([]);
  });
});

describe('whistle, speech-like bursts and level changes (invented inputs)', () => {
  it('tells a warbling 3 kHz whistle from a steady beep', () => {
    const x = signal(8);
    const n = noise(3);
    // Whistle: 3 kHz swept ±150 Hz at 25 Hz (a pea's trill), plus breath noise.
    const from = Math.round(2 * SR);
    let phase = 0;
    for (let i = from; i < from + Math.round(0.8 * SR); i++) {
      const hz = 3000 + 150 * Math.sin((2 * Math.PI * 25 * (i - from)) / SR);
      phase += (2 * Math.PI * hz) / SR;
      x[i] = 0.3 * Math.sin(phase) + 0.02 * n();
    }
    addTone(x, 5, 0.5, 3000, 0.3);
    const events = analyzeAudio(x, SR).filter((e) => e.kind === 'tone' || e.kind === 'whistle');
    expect(events.map((e) => e.kind)).toEqual(['whistle', 'tone']);
    expect(Math.abs(events[0]!.atSeconds - 2)).toBeLessThanOrEqual(0.03);
  });

  it('finds voiced bursts (harmonic buzz) a second apart over quiet noise, and not as tones', () => {
    const x = signal(9);
    const n = noise(5);
    for (let i = 0; i < x.length; i++) x[i] = 0.003 * n();
    // A "voice": 140 Hz buzz with 20 harmonics, 0.35 s long, at 3, 4, 5, 6 s.
    for (const at of [3, 4, 5, 6]) for (let h = 1; h <= 20; h++) addTone(x, at, 0.35, 140 * h, 0.05 / h);
    const events = analyzeAudio(x, SR);
    const speech = events.filter((e) => e.kind === 'speech');
    expect(speech.map((e) => Math.round(e.atSeconds * 10) / 10)).toEqual([3, 4, 5, 6]);
    expect(events.filter((e) => e.kind === 'tone' || e.kind === 'whistle')).toEqual([]);
  });

  it('places a lasting level change (music starting) within 0.2 s, and not a single loud beep', () => {
    const x = signal(20);
    const n = noise(9);
    for (let i = 0; i < x.length; i++) x[i] = (i >= 8 * SR ? 0.3 : 0.01) * n();
    addTone(x, 15, 0.3, 1000, 0.8);
    const energy = analyzeAudio(x, SR).filter((e) => e.kind.startsWith('energy'));
    expect(energy).toHaveLength(1);
    expect(energy[0]!.kind).toBe('energy-rise');
    expect(Math.abs(energy[0]!.atSeconds - 8)).toBeLessThanOrEqual(0.2);
  });

  it('gives the same events streamed in odd-sized chunks as in one piece', () => {
    const x = signal(6);
    addTone(x, 1.5, 0.3, 1200, 0.3);
    addTone(x, 3.5, 0.8, 1200, 0.3);
    const acc = createFrameFeatureAccumulator(SR);
    for (let i = 0; i < x.length; i += 777) acc.push(x.subarray(i, i + 777));
    const whole = createFrameFeatureAccumulator(SR);
    whole.push(x);
    expect(Array.from(acc.finish().peakAmp)).toEqual(Array.from(whole.finish().peakAmp));
  });
});
