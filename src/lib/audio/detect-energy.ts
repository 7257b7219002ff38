/**
 * Broad level changes that last: music starting or stopping, a room going quiet. The level on
 * each side of a moment is the median over two seconds, so a beep, a clap or a word does not
 * count; where the medians differ by at least {@link MIN_CHANGE_DB}, the moment is placed where
 * the mean level (in dB) changes most, which peaks sharply at a step while the medians plateau.
 */
import type { AudioEvent } from './audio-events';
import { clamp01, round3 } from './detect-tonal';
import { FRAMES_PER_SECOND, type FrameFeatures } from './frame-features';
import { RunningPercentile } from './running-percentile';

const SIDE_SECONDS = 2;
const MIN_CHANGE_DB = 8;
/** Levels are compared every this many frames (0.05 s). */
const STEP = 5;
/** Frames quieter than this count as this (digital silence would swamp the mean). */
const FLOOR_DB = -100;

export function detectEnergyEvents(f: FrameFeatures): AudioEvent[] {
  const side = SIDE_SECONDS * FRAMES_PER_SECOND;
  if (f.count < 2 * side) return [];
  const level = (i: number) => Math.max(FLOOR_DB, f.totalDb[i] as number);
  const before = new RunningPercentile(FLOOR_DB, 0);
  const after = new RunningPercentile(FLOOR_DB, 0);
  let sumBefore = 0;
  let sumAfter = 0;
  for (let i = 0; i < side; i++) {
    before.add(level(i));
    sumBefore += level(i);
  }
  for (let i = side; i < 2 * side; i++) {
    after.add(level(i));
    sumAfter += level(i);
  }
  const at: number[] = [];
  const medianChange: number[] = [];
  const meanChange: number[] = [];
  for (let t = side; t + side <= f.count; t++) {
    if ((t - side) % STEP === 0) {
      at.push(t);
      medianChange.push(after.percentile(0.5) - before.percentile(0.5));
      meanChange.push((sumAfter - sumBefore) / side);
    }
    if (t + side >= f.count) break;
    const out = level(t - side);
    const mid = level(t);
    const incoming = level(t + side);
    before.remove(out);
    before.add(mid);
    after.remove(mid);
    after.add(incoming);
    sumBefore += mid - out;
    sumAfter += incoming - mid;
  }
  const events: AudioEvent[] = [];
  const reach = Math.round(side / STEP);
  for (let k = 0; k < at.length; k++) {
    const c = medianChange[k] as number;
    if (Math.abs(c) < MIN_CHANGE_DB) continue;
    const m = meanChange[k] as number;
    if (Math.sign(m) !== Math.sign(c)) continue;
    let best = true;
    for (let j = Math.max(0, k - reach); j <= Math.min(at.length - 1, k + reach) && best; j++) {
      const other = (meanChange[j] as number) * Math.sign(c);
      if (other > Math.abs(m) || (other === Math.abs(m) && j < k)) best = false;
    }
    if (!best) continue;
    events.push({
      atSeconds: round3((at[k] as number) / FRAMES_PER_SECOND),
      kind: c > 0 ? 'energy-rise' : 'energy-fall',
      strength: round3(clamp01(Math.abs(c) / 30)),
      durationSeconds: 0,
    });
  }
  return events;
}
