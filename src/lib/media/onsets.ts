/**
 * Finds audio onsets (boundary tones, claps, a loud count-in) in waveform peaks, for snapping
 * segment boundaries in the editor. Pure and fast enough for a 90-minute class in the browser.
 */
import type { Peaks } from './peaks';

/** Tuning of {@link findOnsets}; the defaults suit tones and claps over room noise or quiet music. */
export interface OnsetOptions {
  /** How far above the local noise floor a peak must rise, in dB. Default 12. */
  riseDb?: number;
  /** Quietest level that can count as an onset, in dBFS. Default -40. */
  minLevelDb?: number;
  /** Minimum time between two onsets, seconds. Default 0.3. */
  minGapSeconds?: number;
  /** Length of the window before each peak whose median is the noise floor, seconds. Default 1.5. */
  floorWindowSeconds?: number;
}

// Levels are bucketed in whole dB from FLOOR_DB to 0 so the running median is a histogram lookup.
const FLOOR_DB = -100;
const BUCKETS = -FLOOR_DB + 1;

/**
 * Returns onset times in seconds, ascending. A peak is an onset when its level rises at least
 * `riseDb` above the median level of the preceding window (robust to earlier onsets in the window),
 * the previous peak did not, it is above `minLevelDb`, and the last onset is at least `minGapSeconds` ago.
 * The reported time is the start of the peak's bin, so the error is below one bin (10 ms at 100/s).
 * Before any history exists the floor is digital silence, so sound at the very start counts as an onset.
 */
export function findOnsets(peaks: Peaks, options: OnsetOptions = {}): number[] {
  const riseDb = options.riseDb ?? 12;
  const minLevelDb = options.minLevelDb ?? -40;
  const minGapBins = Math.max(1, Math.round((options.minGapSeconds ?? 0.3) * peaks.rate));
  const windowBins = Math.max(3, Math.round((options.floorWindowSeconds ?? 1.5) * peaks.rate));
  // The two bins just before a peak are left out of its floor: a rise can span a bin boundary.
  const guard = 2;
  const n = Math.min(peaks.min.length, peaks.max.length);

  const levels = new Int16Array(n);
  const exact = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const amp = Math.max(Math.abs(peaks.min[i] as number), Math.abs(peaks.max[i] as number));
    const db = amp > 0 ? Math.max(FLOOR_DB, 20 * Math.log10(amp)) : FLOOR_DB;
    exact[i] = db;
    levels[i] = Math.round(db) - FLOOR_DB;
  }

  const histogram = new Int32Array(BUCKETS);
  let inWindow = 0;
  const onsets: number[] = [];
  let lastOnset = -Infinity;
  let previousAbove = false;

  for (let i = 0; i < n; i++) {
    // Window = bins [i - guard - windowBins, i - guard).
    const entering = i - guard - 1;
    if (entering >= 0) {
      const b = levels[entering] as number;
      histogram[b] = (histogram[b] ?? 0) + 1;
      inWindow += 1;
    }
    const leaving = i - guard - windowBins - 1;
    if (leaving >= 0) {
      const b = levels[leaving] as number;
      histogram[b] = (histogram[b] ?? 0) - 1;
      inWindow -= 1;
    }
    const floor = inWindow === 0 ? FLOOR_DB : medianDb(histogram, inWindow);
    const level = exact[i] as number;
    const above = level >= minLevelDb && level - floor >= riseDb;
    if (above && !previousAbove && i - lastOnset >= minGapBins) {
      onsets.push(i / peaks.rate);
      lastOnset = i;
    }
    previousAbove = above;
  }
  return onsets;
}

function medianDb(histogram: Int32Array, total: number): number {
  const half = Math.ceil(total / 2);
  let seen = 0;
  for (let b = 0; b < histogram.length; b++) {
    seen += histogram[b] as number;
    if (seen >= half) return b + FLOOR_DB;
  }
  return 0;
}

/**
 * Snaps `time` to the nearest candidate no farther than `maxDistance` seconds; returns `time`
 * unchanged when none is that close. Candidates need not be sorted; on a tie the earlier one wins.
 */
export function snapToNearest(time: number, candidates: readonly number[], maxDistance: number): number {
  let best = time;
  let bestDistance = Infinity;
  for (const c of candidates) {
    const d = Math.abs(c - time);
    if (d <= maxDistance && (d < bestDistance || (d === bestDistance && c < best))) {
      best = c;
      bestDistance = d;
    }
  }
  return best;
}
