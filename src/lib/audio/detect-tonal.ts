/**
 * Timer tones and whistles: runs of frames where one narrow peak holds most of the 500 Hz–4.2 kHz
 * band. A timer's beep keeps its pitch to a fraction of a bin; a whistle's pitch wobbles (the pea
 * rattles), so the spread of the pitch inside a run tells them apart. Music notes and vowels
 * rarely qualify: their power is spread over several harmonics, so no single peak dominates.
 */
import type { AudioEvent } from './audio-events';
import { FRAMES_PER_SECOND, type FrameFeatures } from './frame-features';
import { RunningPercentile } from './running-percentile';

/** Share of the band's power the peak's three bins must hold for a steady tone (tuned on generated signals, no source). */
const MIN_SHARE = 0.55;
/** Share the ±250 Hz around the peak must hold for a warbling whistle (tuned on generated signals, no source). */
const MIN_NEAR_SHARE = 0.7;
/**
 * Share of the power near the peak (±250 Hz) that its three bins must hold for a steady tone: a
 * timer's sine keeps about all of it there, a trilling whistle spreads it over several bins even
 * when its pitch, sampled every 20 ms, looks steady (tuned on generated signals, no source).
 */
const MIN_CONCENTRATION = 0.7;
/** Quietest tone considered, dB re full-scale sine. */
const MIN_LEVEL_DB = -50;
/** Shortest tone, seconds (timer beeps are about 0.1 s and longer). */
const MIN_SECONDS = 0.06;
/**
 * How far a tone must rise above the broad level of the two seconds before it, dB. A timer's beep
 * or a whistle cuts through the room; a note inside the music does not (tuned on generated
 * signals, no source).
 */
const MIN_PROMINENCE_DB = 3;
const BACKGROUND_SECONDS = 2;
/** Frames a run may skip (a whistle's trill dips for a frame or two). */
const MAX_GAP_FRAMES = 2;
/** Largest pitch change between neighbouring frames of one run, Hz. */
const MAX_STEP_HZ = 160;
/** Whistles sit in this band (Hz). */
const WHISTLE_BAND: readonly [number, number] = [1800, 4200];


export interface TonalRun {
  first: number;
  last: number;
}

const dbOf = (amp: number) => (amp > 1e-10 ? 20 * Math.log10(amp) : -200);

/** Frames belonging to a tone or whistle, so speech detection can leave them out. */
export function detectTonalEvents(f: FrameFeatures): { events: AudioEvent[]; tonalMask: Uint8Array } {
  const background = backgroundLevels(f);
  const inWhistleBand = (hz: number) => hz >= WHISTLE_BAND[0] && hz <= WHISTLE_BAND[1];
  const tonal = (i: number) =>
    dbOf(f.peakAmp[i] as number) >= Math.max(MIN_LEVEL_DB, (background[i] as number) + MIN_PROMINENCE_DB) &&
    ((f.peakShare[i] as number) >= MIN_SHARE ||
      ((f.nearShare[i] as number) >= MIN_NEAR_SHARE && inWhistleBand(f.nearHz[i] as number)));
  const runs: TonalRun[] = [];
  let open: TonalRun | null = null;
  let lastHz = 0;
  for (let i = 0; i < f.count; i++) {
    if (!tonal(i)) {
      if (open && i - open.last > MAX_GAP_FRAMES) {
        runs.push(open);
        open = null;
      }
      continue;
    }
    const hz = f.nearHz[i] as number;
    if (open && Math.abs(hz - lastHz) <= MAX_STEP_HZ && i - open.last <= MAX_GAP_FRAMES + 1) {
      open.last = i;
    } else {
      if (open) runs.push(open);
      open = { first: i, last: i };
    }
    lastHz = hz;
  }
  if (open) runs.push(open);

  const events: AudioEvent[] = [];
  const tonalMask = new Uint8Array(f.count);
  for (const run of runs) {
    const event = describeRun(f, run, tonal);
    if (!event) continue;
    events.push(event);
    const from = Math.max(0, Math.floor(event.atSeconds * FRAMES_PER_SECOND) - 2);
    const to = Math.min(f.count - 1, Math.ceil((event.atSeconds + event.durationSeconds) * FRAMES_PER_SECOND) + 2);
    for (let i = from; i <= to; i++) tonalMask[i] = 1;
  }
  return { events, tonalMask };
}

function describeRun(f: FrameFeatures, run: TonalRun, tonal: (i: number) => boolean): AudioEvent | null {
  const hz: number[] = [];
  const amp: number[] = [];
  const share: number[] = [];
  const centre: number[] = [];
  const near: number[] = [];
  for (let i = run.first; i <= run.last; i++) {
    if (!tonal(i)) continue;
    hz.push(f.peakHz[i] as number);
    centre.push(f.nearHz[i] as number);
    amp.push(f.peakAmp[i] as number);
    share.push(f.peakShare[i] as number);
    near.push(f.nearShare[i] as number);
  }
  const meanHz = mean(hz);
  const spreadHz = Math.sqrt(mean(hz.map((h) => (h - meanHz) ** 2)));
  const steady = median(amp);
  const samePitch = (i: number) => Math.abs((f.peakHz[i] as number) - meanHz) <= Math.max(2 * f.binHz, spreadHz * 2);

  // Start and end where the amplitude crosses half its steady value (frame centres, interpolated).
  const halfAmp = steady / 2;
  let s = run.first;
  while (s - 1 >= 0 && run.first - s < 5 && samePitch(s - 1) && (f.peakAmp[s - 1] as number) >= halfAmp) s--;
  const startFrame = crossing(f, s - 1, s, halfAmp);
  let e = run.last;
  while (e + 1 < f.count && e - run.last < 5 && samePitch(e + 1) && (f.peakAmp[e + 1] as number) >= halfAmp) e++;
  const endFrame = crossing(f, e + 1, e, halfAmp);
  const durationSeconds = (endFrame - startFrame) / FRAMES_PER_SECOND;
  if (durationSeconds < MIN_SECONDS) return null;

  // A steady pitch that holds most of the band is a timer; a wobbling one in 1.8–4.2 kHz a whistle.
  const isTone =
    (spreadHz <= 0.75 * f.binHz || hz.length < 4) && median(share) >= MIN_SHARE && median(share) >= MIN_CONCENTRATION * median(near);
  const centreHz = mean(centre);
  let kind: AudioEvent['kind'];
  if (isTone) kind = 'tone';
  else if (centreHz >= WHISTLE_BAND[0] && centreHz <= WHISTLE_BAND[1]) kind = 'whistle';
  else return null;

  const levelDb = dbOf(steady);
  const purity = kind === 'tone' ? (median(share) - MIN_SHARE) / (1 - MIN_SHARE) : (median(near) - MIN_NEAR_SHARE) / (1 - MIN_NEAR_SHARE);
  const strength = clamp01(purity * 0.5 + ((levelDb - MIN_LEVEL_DB) / 40) * 0.5);
  return {
    atSeconds: round3(Math.max(0, startFrame / FRAMES_PER_SECOND)),
    kind,
    strength: round3(strength),
    durationSeconds: round3(durationSeconds),
    frequencyHz: Math.round(kind === 'tone' ? meanHz : centreHz),
  };
}

/**
 * Median whole-spectrum level of the two seconds before each frame (leaving out the last 0.1 s,
 * which a tone's own onset may already fill); digital silence before the first sound counts as -120 dB.
 */
function backgroundLevels(f: FrameFeatures): Float32Array {
  const window = BACKGROUND_SECONDS * FRAMES_PER_SECOND;
  const guard = 10;
  const levels = new RunningPercentile(-120, 0);
  const out = new Float32Array(f.count);
  for (let i = 0; i < f.count; i++) {
    const entering = i - guard;
    if (entering >= 0) levels.add(f.totalDb[entering] as number);
    const leaving = i - guard - window;
    if (leaving >= 0) levels.remove(f.totalDb[leaving] as number);
    out[i] = levels.size === 0 ? -120 : levels.percentile(0.5);
  }
  return out;
}

/** Fractional frame between `outside` and `inside` where the amplitude crosses `level`. */
function crossing(f: FrameFeatures, outside: number, inside: number, level: number): number {
  if (outside < 0 || outside >= f.count) return inside;
  const a = f.peakAmp[outside] as number;
  const b = f.peakAmp[inside] as number;
  if (b <= a) return (outside + inside) / 2;
  const t = Math.max(0, Math.min(1, (level - a) / (b - a)));
  return outside + (inside - outside) * t;
}

export const mean = (xs: readonly number[]) => (xs.length === 0 ? 0 : xs.reduce((s, x) => s + x, 0) / xs.length);
export function median(xs: readonly number[]): number {
  if (xs.length === 0) return 0;
  const sorted = [...xs].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? (sorted[mid] as number) : ((sorted[mid - 1] as number) + (sorted[mid] as number)) / 2;
}
export const clamp01 = (x: number) => Math.max(0, Math.min(1, x));
export const round3 = (x: number) => Math.round(x * 1000) / 1000;
