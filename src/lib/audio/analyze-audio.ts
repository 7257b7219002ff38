/**
 * Entry of the audio analysis: mono PCM in (whole or streamed), audio events out.
 */
import { sortEvents, type AudioEvent } from './audio-events';
import { detectEnergyEvents } from './detect-energy';
import { detectSpeechEvents } from './detect-speech';
import { detectTonalEvents } from './detect-tonal';
import { createFrameFeatureAccumulator, type FrameFeatures } from './frame-features';

/**
 * Sample rate the worker decodes to: its Nyquist frequency (4.8 kHz) clears the 4.2 kHz top of
 * the tonal band with room for ffmpeg's resampling filter, and 192 samples make one 20 ms hop.
 */
export const ANALYSIS_SAMPLE_RATE = 9600;

/** Events from per-frame features. */
export function eventsFromFeatures(features: FrameFeatures): AudioEvent[] {
  const { events: tonal, tonalMask } = detectTonalEvents(features);
  return sortEvents([...tonal, ...detectSpeechEvents(features, tonalMask), ...detectEnergyEvents(features)]);
}

/** Streaming analyser: push chunks of mono samples in [-1, 1], then finish. */
export function createAudioAnalyzer(sampleRate: number): { push(samples: Float32Array): void; finish(): AudioEvent[] } {
  const acc = createFrameFeatureAccumulator(sampleRate);
  return { push: (samples) => acc.push(samples), finish: () => eventsFromFeatures(acc.finish()) };
}

/** Detects the events of a whole signal held in memory. */
export function analyzeAudio(samples: Float32Array, sampleRate: number): AudioEvent[] {
  const analyzer = createAudioAnalyzer(sampleRate);
  analyzer.push(samples);
  return analyzer.finish();
}
