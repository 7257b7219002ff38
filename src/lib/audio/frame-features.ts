/**
 * Short-time spectra of a mono signal, reduced to the few figures per frame the detectors need.
 * The FFT is fft.js (a maintained radix-4 implementation); this module only windows, hops and
 * sums bands. It is streaming: feed PCM chunks as they arrive from the decoder, so a 90-minute
 * class never sits in memory as samples.
 */
import FFT from 'fft.js';

/**
 * Hop between frames: 20 ms. Tone starts are interpolated between frames to a few ms, and half
 * the frames of a 10 ms hop keep the analysis within the time of decoding the audio.
 */
export const FRAMES_PER_SECOND = 50;

/** Band where timer tones and whistles are looked for (Hz). */
export const TONAL_BAND: readonly [number, number] = [500, 4200];
/** Band of speech energy (Hz): the telephone band, where a voice's formants carry. */
export const VOICE_BAND: readonly [number, number] = [300, 3400];

/** Per-frame figures; index i is the frame centred on i / FRAMES_PER_SECOND seconds. */
export interface FrameFeatures {
  sampleRate: number;
  fftSize: number;
  /** Hz per FFT bin. */
  binHz: number;
  count: number;
  /** Whole-spectrum power, dB relative to a full-scale sine. */
  totalDb: Float32Array;
  /** Voice-band power, dB (same reference). */
  voiceDb: Float32Array;
  /** Strongest peak in the tonal band: interpolated frequency (Hz) and amplitude (linear, full-scale sine = 1). */
  peakHz: Float32Array;
  peakAmp: Float32Array;
  /** Share of the tonal band's power in the peak's three bins (1 = a pure tone, ~0.05 = noise). */
  peakShare: Float32Array;
  /** Share of the tonal band's power within ±{@link NEAR_PEAK_HZ} of the peak (a warbling whistle keeps it high). */
  nearShare: Float32Array;
  /** Power-weighted mean frequency within ±{@link NEAR_PEAK_HZ} of the peak, Hz (steadier than the peak for a warble). */
  nearHz: Float32Array;
}

/** Half-width of the neighbourhood of the peak that a warbling whistle stays within, Hz. */
export const NEAR_PEAK_HZ = 250;

export interface FrameFeatureAccumulator {
  push(samples: Float32Array): void;
  finish(): FrameFeatures;
}

/**
 * FFT length for a sample rate: the largest power of two within about 30 ms (256 points at the
 * 9.6 kHz analysis rate: 26.7 ms, 37.5 Hz bins). Long enough to split a 500 Hz tone from speech
 * harmonics, short enough to place a tone's start to a few ms, and half the work of 512 points.
 */
export function fftSizeFor(sampleRate: number): number {
  let size = 128;
  while (size * 2 <= sampleRate * 0.03) size *= 2;
  return size;
}

/**
 * Creates the accumulator. Frame i covers samples [i·hop − N/2, i·hop + N/2) with zeros before
 * the start, so its centre is exactly i·hop: a tone's start is where its amplitude first reaches
 * half its steady value (the window then covers the tone's first half-window).
 */
export function createFrameFeatureAccumulator(sampleRate: number): FrameFeatureAccumulator {
  if (!(sampleRate >= 9000)) throw new RangeError('the analysis needs at least 9 kHz to hear tones up to 4.2 kHz');
  const size = fftSizeFor(sampleRate);
  const half = size / 2;
  const hop = sampleRate / FRAMES_PER_SECOND; // may be fractional: frame centres are rounded
  const fft = new FFT(size);
  const window = new Float64Array(size);
  let windowSum = 0;
  for (let i = 0; i < size; i++) {
    window[i] = 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / size); // Hann
    windowSum += window[i] as number;
  }
  // A full-scale sine centred on a bin gives |X| = windowSum / 2: dividing by it makes amplitude 1.
  const ampScale = 2 / windowSum;
  const powerScale = ampScale * ampScale;
  const binHz = sampleRate / size;
  const bin = (hz: number) => Math.round(hz / binHz);
  const [tonalLo, tonalHi] = [bin(TONAL_BAND[0]), Math.min(half - 2, bin(TONAL_BAND[1]))];
  // Interpolated peaks are trusted to half a bin.
  const [bandLoHz, bandHiHz] = [TONAL_BAND[0] - binHz / 2, TONAL_BAND[1] + binHz / 2];
  const [voiceLo, voiceHi] = [bin(VOICE_BAND[0]), Math.min(half - 1, bin(VOICE_BAND[1]))];

  // Typed arrays allocated once: fft.js only indexes its arguments, so it accepts them.
  const frame = new Float64Array(size);
  const spectrum = new Float64Array(2 * size);
  const power = new Float64Array(half + 1);

  // Samples from `bufferStart` on (the oldest any pending frame still needs); `received` counts all samples so far.
  let buffer = new Float32Array(Math.max(size * 4, 65536));
  let bufferStart = 0;
  let received = 0;
  let nextFrame = 0;
  let nextFrameEnd = half;

  let capacity = 4096;
  let totalDb = new Float32Array(capacity);
  let voiceDb = new Float32Array(capacity);
  let peakHz = new Float32Array(capacity);
  let peakAmp = new Float32Array(capacity);
  let peakShare = new Float32Array(capacity);
  let nearShare = new Float32Array(capacity);
  let nearHz = new Float32Array(capacity);
  const nearBins = Math.round(NEAR_PEAK_HZ / binHz);
  const grow = () => {
    capacity *= 2;
    const g = (a: Float32Array) => {
      const b = new Float32Array(capacity);
      b.set(a);
      return b;
    };
    totalDb = g(totalDb);
    voiceDb = g(voiceDb);
    peakHz = g(peakHz);
    peakAmp = g(peakAmp);
    peakShare = g(peakShare);
    nearShare = g(nearShare);
    nearHz = g(nearHz);
  };

  const toDb = (p: number) => (p > 1e-20 ? 10 * Math.log10(p) : -200);

  /** Analyses frame `index`, whose last sample (exclusive end) has been received. */
  const analyse = (index: number) => {
    const start = Math.round(index * hop) - half;
    const offset = start - bufferStart;
    if (start >= 0 && start + size <= received) {
      for (let i = 0; i < size; i++) frame[i] = buffer[offset + i]! * window[i]!;
    } else {
      for (let i = 0; i < size; i++) {
        const s = start + i;
        frame[i] = s < 0 || s >= received ? 0 : buffer[s - bufferStart]! * window[i]!;
      }
    }
    fft.realTransform(spectrum, frame);
    // One pass over the bins: whole spectrum, voice band, tonal band and its strongest bin.
    let total = 0;
    let voice = 0;
    let band = 0;
    let best = tonalLo;
    let bestPower = -1;
    for (let k = 0; k <= half; k++) {
      const re = spectrum[2 * k]!;
      const im = spectrum[2 * k + 1]!;
      const p = (re * re + im * im) * powerScale;
      power[k] = p;
      total += p;
      if (k >= voiceLo && k <= voiceHi) voice += p;
      // The band's power includes the bins either side, as the peak's three bins may.
      if (k >= tonalLo - 1 && k <= tonalHi + 1) band += p;
      if (k >= tonalLo && k <= tonalHi) {
        if (p > bestPower) {
          bestPower = p;
          best = k;
        }
      }
    }
    const pa = power[best - 1]!;
    const pc = power[best + 1]!;
    const a = Math.sqrt(pa);
    const b = Math.sqrt(bestPower);
    const c = Math.sqrt(pc);
    // Parabolic interpolation of the magnitude peak: within a tenth of a bin for a Hann window.
    const denom = a - 2 * b + c;
    const shift = denom < 0 ? Math.max(-0.5, Math.min(0.5, (0.5 * (a - c)) / denom)) : 0;
    const peak3 = pa + bestPower + pc;
    const hz = (best + shift) * binHz;
    if (index >= capacity) grow();
    totalDb[index] = toDb(total);
    voiceDb[index] = toDb(voice);
    peakHz[index] = hz;
    // Three-bin power sum recovers a Hann-windowed sine's power wherever it falls between bins.
    peakAmp[index] = Math.sqrt(peak3 / 1.5);
    // A peak that lies outside the band (a vowel's harmonic just under 500 Hz whose skirt reaches
    // the band's first bin) is not a tone in the band.
    const skirt = pa > bestPower || pc > bestPower || hz < bandLoHz || hz > bandHiHz;
    peakShare[index] = band > 0 && !skirt ? peak3 / band : 0;
    let near = 0;
    let moment = 0;
    const nearTo = Math.min(tonalHi, best + nearBins);
    for (let k = Math.max(tonalLo, best - nearBins); k <= nearTo; k++) {
      near += power[k]!;
      moment += power[k]! * k;
    }
    nearShare[index] = band > 0 && !skirt ? near / band : 0;
    nearHz[index] = near > 0 ? (moment / near) * binHz : 0;
  };

  return {
    push(samples: Float32Array) {
      // Drop what no pending frame needs, then append.
      const keepFrom = Math.max(0, Math.min(received, Math.round(nextFrame * hop) - half));
      if (keepFrom > bufferStart) {
        buffer.copyWithin(0, keepFrom - bufferStart, received - bufferStart);
        bufferStart = keepFrom;
      }
      const needed = received - bufferStart + samples.length;
      if (needed > buffer.length) {
        const bigger = new Float32Array(Math.max(needed, buffer.length * 2));
        bigger.set(buffer.subarray(0, received - bufferStart));
        buffer = bigger;
      }
      buffer.set(samples, received - bufferStart);
      received += samples.length;
      // Frame n needs samples up to its centre + half (exclusive).
      while (nextFrameEnd <= received) {
        analyse(nextFrame++);
        nextFrameEnd = Math.round(nextFrame * hop) + half;
      }
    },
    finish(): FrameFeatures {
      // Frames whose window runs past the end see zeros there; stop at the last sample.
      while (Math.round(nextFrame * hop) < received) analyse(nextFrame++);
      const count = nextFrame;
      return {
        sampleRate,
        fftSize: size,
        binHz,
        count,
        totalDb: totalDb.subarray(0, count),
        voiceDb: voiceDb.subarray(0, count),
        peakHz: peakHz.subarray(0, count),
        peakAmp: peakAmp.subarray(0, count),
        peakShare: peakShare.subarray(0, count),
        nearShare: nearShare.subarray(0, count),
        nearHz: nearHz.subarray(0, count),
      };
    },
  };
}
