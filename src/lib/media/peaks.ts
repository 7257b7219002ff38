/**
 * Audio peaks for the editor's waveform: min/max pairs at a fixed rate (default 100 per second),
 * and a compact binary file format that browsers decode with DataView alone.
 *
 * File layout (little-endian), version 1:
 *   0  4 bytes  magic "RMPK"
 *   4  u8       version (1)
 *   5  u8       bits per value: 8 (Int8) or 16 (Int16)
 *   6  u16      reserved, 0
 *   8  u32      peaks per second
 *   12 u32      number of peaks (pairs)
 *   16 ...      pairs: min, max (signed, full scale = 127 or 32767)
 */

/** Min/max envelope of a mono signal, values in [-1, 1]. */
export interface Peaks {
  /** Peaks per second. */
  rate: number;
  min: Float32Array;
  max: Float32Array;
}

export const PEAKS_MAGIC = 'RMPK';
export const PEAKS_VERSION = 1;
export const PEAKS_HEADER_BYTES = 16;
export const DEFAULT_PEAKS_RATE = 100;

/** Streaming min/max reducer: feed PCM chunks as they arrive, then {@link PeaksAccumulator.finish}. */
export interface PeaksAccumulator {
  push(samples: Float32Array | Int16Array): void;
  finish(): Peaks;
}

/**
 * Creates a streaming accumulator. Peak i covers samples [floor(i·sr/rate), floor((i+1)·sr/rate)),
 * so the count is ceil(samples·rate/sr): duration × rate, ±1 for a partial last bin.
 */
export function createPeaksAccumulator(sampleRate: number, rate: number = DEFAULT_PEAKS_RATE): PeaksAccumulator {
  if (!(sampleRate > 0) || !(rate > 0) || rate > sampleRate) throw new RangeError('need 0 < rate ≤ sampleRate');
  let mins = new Float32Array(1024);
  let maxs = new Float32Array(1024);
  let count = 0; // completed + current bin
  let sampleIndex = 0;
  let binEnd = 0; // sample index where the current bin ends
  let curMin = Infinity;
  let curMax = -Infinity;

  const grow = () => {
    const nextMin = new Float32Array(mins.length * 2);
    const nextMax = new Float32Array(maxs.length * 2);
    nextMin.set(mins);
    nextMax.set(maxs);
    mins = nextMin;
    maxs = nextMax;
  };
  const closeBin = () => {
    if (count >= mins.length) grow();
    mins[count] = curMin === Infinity ? 0 : curMin;
    maxs[count] = curMax === -Infinity ? 0 : curMax;
    count += 1;
    curMin = Infinity;
    curMax = -Infinity;
    binEnd = Math.floor(((count + 1) * sampleRate) / rate);
  };
  binEnd = Math.floor(sampleRate / rate);

  return {
    push(samples) {
      const scale = samples instanceof Int16Array ? 1 / 32768 : 1;
      for (let i = 0; i < samples.length; i++) {
        if (sampleIndex >= binEnd) closeBin();
        const v = (samples[i] as number) * scale;
        if (v < curMin) curMin = v;
        if (v > curMax) curMax = v;
        sampleIndex += 1;
      }
    },
    finish() {
      if (curMin !== Infinity) closeBin();
      return { rate, min: mins.slice(0, count), max: maxs.slice(0, count) };
    },
  };
}

/** Min/max peaks of a whole mono signal. */
export function computePeaks(samples: Float32Array | Int16Array, sampleRate: number, rate: number = DEFAULT_PEAKS_RATE): Peaks {
  const acc = createPeaksAccumulator(sampleRate, rate);
  acc.push(samples);
  return acc.finish();
}

/** Peaks of silence, for recordings without a sound track (the waveform is then a flat line). */
export function silentPeaks(durationSeconds: number, rate: number = DEFAULT_PEAKS_RATE): Peaks {
  const count = Math.ceil(durationSeconds * rate);
  return { rate, min: new Float32Array(count), max: new Float32Array(count) };
}

/** Duration covered by the peaks, in seconds. */
export function peaksDuration(peaks: Peaks): number {
  return peaks.min.length / peaks.rate;
}

/** Loudest absolute value as dBFS (-Infinity for digital silence); feeds the silent-audio warning. */
export function peaksMaxDb(peaks: Peaks): number {
  let m = 0;
  for (let i = 0; i < peaks.min.length; i++) {
    m = Math.max(m, Math.abs(peaks.min[i] as number), Math.abs(peaks.max[i] as number));
  }
  return m === 0 ? -Infinity : 20 * Math.log10(m);
}

/**
 * Encodes peaks. Quantisation rounds min down and max up so the drawn envelope never looks
 * quieter than the audio; 8 bits (2 bytes per 10 ms, ~720 KB per hour) is plenty for a waveform.
 */
export function encodePeaks(peaks: Peaks, bits: 8 | 16 = 8): Uint8Array {
  const count = peaks.min.length;
  if (peaks.max.length !== count) throw new Error('min and max must have the same length');
  const bytesPerValue = bits / 8;
  const out = new Uint8Array(PEAKS_HEADER_BYTES + count * 2 * bytesPerValue);
  const view = new DataView(out.buffer);
  for (let i = 0; i < 4; i++) out[i] = PEAKS_MAGIC.charCodeAt(i);
  view.setUint8(4, PEAKS_VERSION);
  view.setUint8(5, bits);
  view.setUint16(6, 0, true);
  view.setUint32(8, peaks.rate, true);
  view.setUint32(12, count, true);
  const full = bits === 8 ? 127 : 32767;
  const clamp = (v: number) => Math.max(-full, Math.min(full, v));
  let offset = PEAKS_HEADER_BYTES;
  for (let i = 0; i < count; i++) {
    const lo = clamp(Math.floor((peaks.min[i] as number) * full));
    const hi = clamp(Math.ceil((peaks.max[i] as number) * full));
    if (bits === 8) {
      view.setInt8(offset, lo);
      view.setInt8(offset + 1, hi);
    } else {
      view.setInt16(offset, lo, true);
      view.setInt16(offset + 2, hi, true);
    }
    offset += 2 * bytesPerValue;
  }
  return out;
}

/** Decodes a peaks file; throws with a clear message on anything that is not one. */
export function decodePeaks(bytes: Uint8Array): Peaks {
  if (bytes.length < PEAKS_HEADER_BYTES) throw new Error('not a peaks file: too short');
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const magic = String.fromCharCode(bytes[0] ?? 0, bytes[1] ?? 0, bytes[2] ?? 0, bytes[3] ?? 0);
  if (magic !== PEAKS_MAGIC) throw new Error('not a peaks file: bad magic');
  const version = view.getUint8(4);
  if (version !== PEAKS_VERSION) throw new Error(`unsupported peaks version ${version}`);
  const bits = view.getUint8(5);
  if (bits !== 8 && bits !== 16) throw new Error(`unsupported peaks sample size ${bits}`);
  const rate = view.getUint32(8, true);
  const count = view.getUint32(12, true);
  const bytesPerValue = bits / 8;
  if (bytes.length !== PEAKS_HEADER_BYTES + count * 2 * bytesPerValue) throw new Error('peaks file length does not match its header');
  const full = bits === 8 ? 127 : 32767;
  const min = new Float32Array(count);
  const max = new Float32Array(count);
  let offset = PEAKS_HEADER_BYTES;
  for (let i = 0; i < count; i++) {
    if (bits === 8) {
      min[i] = view.getInt8(offset) / full;
      max[i] = view.getInt8(offset + 1) / full;
    } else {
      min[i] = view.getInt16(offset, true) / full;
      max[i] = view.getInt16(offset + 2, true) / full;
    }
    offset += 2 * bytesPerValue;
  }
  return { rate, min, max };
}
