import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  computePeaks,
  createPeaksAccumulator,
  decodePeaks,
  encodePeaks,
  peaksMaxDb,
  silentPeaks,
} from '~/lib/media/peaks';

describe('computePeaks', () => {
  it('gives min/max per 10 ms bin of a half-silent, half-square signal (Int16 input)', () => {
    // 1 s at 8 kHz: 0.5 s silence, then a ±16384 square wave (±0.5 of full scale 32768).
    const samples = new Int16Array(8000);
    for (let i = 4000; i < 8000; i++) samples[i] = i % 2 === 0 ? 16384 : -16384;
    const peaks = computePeaks(samples, 8000, 100);
    expect(peaks.rate).toBe(100);
    expect(peaks.min.length).toBe(100);
    expect(Array.from(peaks.max.slice(0, 50))).toEqual(new Array(50).fill(0));
    expect(Array.from(peaks.min.slice(50))).toEqual(new Array(50).fill(-0.5));
    expect(Array.from(peaks.max.slice(50))).toEqual(new Array(50).fill(0.5));
  });

  it.each([
    // [sample rate, samples, expected count] — count = ceil(samples · rate / sampleRate)
    [8000, 8000, 100],
    [8000, 8040, 101],
    [8000, 8041, 101],
    [44100, 44100 * 12, 1200],
    [22050, 1, 1],
    [22050, 0, 0],
  ])('at %i Hz, %i samples give %i peaks', (sampleRate, n, count) => {
    expect(computePeaks(new Float32Array(n), sampleRate, 100).min.length).toBe(count);
  });

  it.each([
    // 22050 Hz / 100 = 220.5 samples per bin: bin 0 = [0,220), bin 1 = [220,441), bin 2 = [441,661)
    [219, 0], [220, 1], [440, 1], [441, 2], [660, 2], [661, 3],
  ])('a spike at sample %i lands in bin %i', (at, bin) => {
    const samples = new Float32Array(1000);
    samples[at] = 0.75;
    const peaks = computePeaks(samples, 22050, 100);
    expect(Array.from(peaks.max).indexOf(0.75)).toBe(bin);
  });

  it('gives the same result however the stream is chunked (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: -32768, max: 32767 }), { minLength: 0, maxLength: 3000 }),
        fc.array(fc.integer({ min: 1, max: 400 }), { minLength: 1, maxLength: 20 }),
        (values, cuts) => {
          const all = Int16Array.from(values);
          const whole = computePeaks(all, 8000, 100);
          const acc = createPeaksAccumulator(8000, 100);
          let at = 0;
          let k = 0;
          while (at < all.length) {
            const size = cuts[k++ % cuts.length]!;
            acc.push(all.subarray(at, at + size));
            at += size;
          }
          const streamed = acc.finish();
          expect(Array.from(streamed.min)).toEqual(Array.from(whole.min));
          expect(Array.from(streamed.max)).toEqual(Array.from(whole.max));
        },
      ),
    );
  });
});

describe('peaks file', () => {
  it('encodes the documented 8-bit layout byte for byte', () => {
    const bytes = encodePeaks({ rate: 100, min: Float32Array.from([-1, -0.5, 0]), max: Float32Array.from([1, 0.25, 0]) });
    // "RMPK", version 1, 8 bits, reserved 0, rate 100 LE, count 3 LE, then pairs:
    // -1 → floor(-127) = -127 (0x81), 1 → 127 (0x7F); -0.5 → floor(-63.5) = -64 (0xC0), 0.25 → ceil(31.75) = 32 (0x20).
    expect(Array.from(bytes)).toEqual([
      0x52, 0x4d, 0x50, 0x4b, 1, 8, 0, 0, 100, 0, 0, 0, 3, 0, 0, 0, 0x81, 0x7f, 0xc0, 0x20, 0, 0,
    ]);
  });

  it.each([8, 16] as const)('round-trips at %i bits; the decoded envelope never shrinks', (bits) => {
    const min = Float32Array.from([-0.9, -0.3, -0.001, 0, -1]);
    const max = Float32Array.from([0.8, 0.31, 0.002, 0, 1]);
    const decoded = decodePeaks(encodePeaks({ rate: 50, min, max }, bits));
    expect(decoded.rate).toBe(50);
    expect(decoded.min.length).toBe(5);
    const step = bits === 8 ? 1 / 127 : 1 / 32767;
    for (let i = 0; i < 5; i++) {
      expect(decoded.min[i]!).toBeLessThanOrEqual(min[i]!);
      expect(decoded.max[i]!).toBeGreaterThanOrEqual(max[i]!);
      expect(min[i]! - decoded.min[i]!).toBeLessThanOrEqual(step + 1e-7);
      expect(decoded.max[i]! - max[i]!).toBeLessThanOrEqual(step + 1e-7);
    }
  });

  it('decodes from a view into a larger buffer (as fetched bytes often are)', () => {
    const encoded = encodePeaks(silentPeaks(1.5, 100));
    const padded = new Uint8Array(encoded.length + 7);
    padded.set(encoded, 3);
    expect(decodePeaks(padded.subarray(3, 3 + encoded.length)).min.length).toBe(150);
  });

  it.each([
    ['too short', new Uint8Array(10), /too short/],
    ['bad magic', Uint8Array.from([0x58, 0x58, 0x58, 0x58, 1, 8, 0, 0, 100, 0, 0, 0, 0, 0, 0, 0]), /bad magic/],
    ['version 2', Uint8Array.from([0x52, 0x4d, 0x50, 0x4b, 2, 8, 0, 0, 100, 0, 0, 0, 0, 0, 0, 0]), /version 2/],
    ['12 bits', Uint8Array.from([0x52, 0x4d, 0x50, 0x4b, 1, 12, 0, 0, 100, 0, 0, 0, 0, 0, 0, 0]), /sample size/],
    ['cut short', Uint8Array.from([0x52, 0x4d, 0x50, 0x4b, 1, 8, 0, 0, 100, 0, 0, 0, 2, 0, 0, 0, 1, 2]), /length/],
  ])('rejects %s', (_name, bytes, message) => {
    expect(() => decodePeaks(bytes)).toThrow(message);
  });
});

describe('helpers', () => {
  it('silentPeaks covers the duration', () => {
    expect(silentPeaks(12, 100).min.length).toBe(1200);
  });

  it.each([
    [0.5, -6.0206], // 20·log10(0.5)
    [1, 0],
    [0.001, -60],
  ])('peaksMaxDb of a peak at %f is %f dBFS', (amplitude, db) => {
    expect(peaksMaxDb({ rate: 100, min: Float32Array.from([-amplitude / 2]), max: Float32Array.from([amplitude]) })).toBeCloseTo(db, 3);
  });

  it('peaksMaxDb of digital silence is -Infinity', () => {
    expect(peaksMaxDb(silentPeaks(1))).toBe(-Infinity);
  });
});
