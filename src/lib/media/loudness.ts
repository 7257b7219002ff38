/**
 * Loudness of a recording's sound: integrated loudness per ITU-R BS.1770-4 as ffmpeg's `ebur128`
 * filter reports it (EBU R 128), the gain the waveform gets so quiet recordings still show their
 * shape and onsets, and the level below which the coach is warned. Pure.
 */
import type { Peaks } from './peaks';

/** EBU R 128's programme loudness target, in LUFS (EBU R 128, 2020 revision). */
export const EBU_R128_TARGET_LUFS = -23;

/**
 * Below this integrated loudness the coach is warned the recording is very quiet. Our choice
 * (common practice, no source): 12 LU under EBU R 128's target, i.e. members would have to turn
 * their volume up about four times to hear the class as loud as broadcast programmes.
 */
export const QUIET_LUFS = -35;

/**
 * Most gain the waveform gets (common practice, no source): enough for a recording 40 dB too quiet,
 * without lifting digital noise of a near-silent track into a full waveform.
 */
export const MAX_DISPLAY_GAIN_DB = 40;

/**
 * Reads the integrated loudness from the Summary `ebur128` prints at the end of a run
 * (`I:   -23.0 LUFS`). Null when there is no summary or no measurable sound (`-inf`, or the
 * `-70.0` ebur128 prints when every block is below the absolute gate).
 */
export function parseIntegratedLoudness(stderr: string): number | null {
  const summary = stderr.lastIndexOf('Summary:');
  if (summary < 0) return null;
  const match = /Integrated loudness:\s*\n\s*I:\s*(-?[\d.]+|-inf)\s*LUFS/.exec(stderr.slice(summary));
  if (!match || match[1] === '-inf') return null;
  const value = Number(match[1]);
  return Number.isFinite(value) && value > -70 ? value : null;
}

/** Gain in dB that brings the recording's loudness up to EBU R 128's target for display: never a cut. */
export function displayGainDb(integratedLufs: number | null): number {
  if (integratedLufs === null) return 0;
  return Math.min(MAX_DISPLAY_GAIN_DB, Math.max(0, EBU_R128_TARGET_LUFS - integratedLufs));
}

/** Peaks multiplied by a gain (clipped at full scale), for the waveform and onset finding. */
export function scalePeaks(peaks: Peaks, gainDb: number): Peaks {
  if (gainDb === 0) return peaks;
  const factor = 10 ** (gainDb / 20);
  const scale = (values: Float32Array) => values.map((v) => Math.max(-1, Math.min(1, v * factor)));
  return { rate: peaks.rate, min: scale(peaks.min), max: scale(peaks.max) };
}

/** Whether the coach should hear that the recording is very quiet (silent tracks get their own warning). */
export const isTooQuiet = (integratedLufs: number | null): boolean => integratedLufs !== null && integratedLufs < QUIET_LUFS;
