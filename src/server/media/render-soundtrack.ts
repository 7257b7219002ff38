/**
 * Renders an invented class soundtrack (see lib/media/class-soundtrack.ts) to a media file:
 * speaks every line with espeak-ng, mixes, and encodes with ffmpeg. Used by the accuracy tests,
 * the benchmark and demo media.
 */
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { buildEncodeSoundtrackArgs } from '~/lib/media/pcm-args';
import { mixSoundtrack, type SoundtrackScore } from '~/lib/media/class-soundtrack';
import { decodeMonoPcm, runFfmpeg, speakToWav } from './ffmpeg-runner';

/** espeak-ng writes 22.05 kHz; mixing at that rate avoids resampling the voices. */
export const SOUNDTRACK_SAMPLE_RATE = 22050;

const VOICES = {
  coach: { voice: 'en', wordsPerMinute: 175, pitch: 45 },
  chatter: { voice: 'en+f3', wordsPerMinute: 160, pitch: 70 },
} as const;

/**
 * Speaks each distinct line once; clips start at their first sound (leading silence cut). Pass
 * the same `clips` map to several renders to speak shared lines only once.
 */
export async function speakLines(score: SoundtrackScore, dir: string, clips = new Map<string, Float32Array>()): Promise<Map<string, Float32Array>> {
  let n = 0;
  for (const line of score.lines) {
    const key = `${line.voice}:${line.text}`;
    if (clips.has(key)) continue;
    const wav = join(dir, `line-${n++}.wav`);
    await speakToWav(line.text, wav, VOICES[line.voice]);
    const parts: Float32Array[] = [];
    await decodeMonoPcm(wav, SOUNDTRACK_SAMPLE_RATE, (s) => parts.push(s));
    const all = concat(parts);
    let first = 0;
    while (first < all.length && Math.abs(all[first] as number) < 0.01) first++;
    clips.set(key, all.subarray(first));
  }
  return clips;
}

/** Options of {@link renderSoundtrack} and {@link writeSoundtrackPcm}. */
export interface SoundtrackRenderOptions {
  seed?: number;
  clips?: Map<string, Float32Array>;
}

/**
 * Speaks and mixes the soundtrack into raw mono float PCM at {@link SOUNDTRACK_SAMPLE_RATE}
 * (`path`), for a caller that encodes it with its own picture (the demo recordings). `dir`
 * holds the spoken clips meanwhile; the caller owns it.
 */
export async function writeSoundtrackPcm(score: SoundtrackScore, path: string, dir: string, options: SoundtrackRenderOptions = {}): Promise<void> {
  const clips = await speakLines(score, dir, options.clips);
  const pcm = mixSoundtrack(score, clips, SOUNDTRACK_SAMPLE_RATE, options.seed ?? 1);
  await writeFile(path, new Uint8Array(pcm.buffer, pcm.byteOffset, pcm.byteLength));
}

/** Writes the soundtrack to `output` (AAC; in MP4 with a small grey video when `video` is given). */
export async function renderSoundtrack(
  score: SoundtrackScore,
  output: string,
  options: SoundtrackRenderOptions & { video?: { width: number; height: number; fps: number } } = {},
): Promise<void> {
  const dir = await mkdtemp(join(tmpdir(), 'roundmark-soundtrack-'));
  try {
    const raw = join(dir, 'mix.f32');
    await writeSoundtrackPcm(score, raw, dir, options);
    await runFfmpeg(buildEncodeSoundtrackArgs({ input: raw, sampleRate: SOUNDTRACK_SAMPLE_RATE, output, ...(options.video ? { video: options.video } : {}) }));
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}

function concat(parts: readonly Float32Array[]): Float32Array {
  const out = new Float32Array(parts.reduce((n, p) => n + p.length, 0));
  let at = 0;
  for (const p of parts) {
    out.set(p, at);
    at += p.length;
  }
  return out;
}
