/**
 * Decodes a recording's audio once and runs the audio analysis on the stream; the same samples
 * can feed the waveform peaks, so packaging needs one decode for both.
 */
import { ANALYSIS_SAMPLE_RATE, createAudioAnalyzer } from '~/lib/audio/analyze-audio';
import type { AudioEvent } from '~/lib/audio/audio-events';
import { createPeaksAccumulator, type Peaks } from '~/lib/media/peaks';
import { decodeMonoPcm, type PeaksReadOptions } from './ffmpeg-runner';

export interface RecordingAudio {
  events: AudioEvent[];
  /** Present when `peaksRate` was asked for. */
  peaks?: Peaks;
}

/** Rejects with FfmpegError when the file has no audio stream. */
export async function analyzeRecordingAudio(path: string, options: PeaksReadOptions & { peaksRate?: number } = {}): Promise<RecordingAudio> {
  const analyzer = createAudioAnalyzer(ANALYSIS_SAMPLE_RATE);
  const peaks = options.peaksRate ? createPeaksAccumulator(ANALYSIS_SAMPLE_RATE, options.peaksRate) : null;
  const { peaksRate: _ignored, ...read } = options;
  await decodeMonoPcm(path, ANALYSIS_SAMPLE_RATE, (samples) => {
    analyzer.push(samples);
    peaks?.push(samples);
  }, read);
  const events = analyzer.finish();
  return peaks ? { events, peaks: peaks.finish() } : { events };
}
