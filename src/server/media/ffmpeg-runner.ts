/**
 * The only module that spawns ffmpeg/ffprobe. Argument lists come from the pure builders in
 * src/lib/media; this module runs them, parses `-progress` output, and reads probe JSON and PCM.
 *
 * It uses node:child_process, not a wrapper library: see docs/decisions/ffmpeg-runner-without-fluent-ffmpeg.md
 * (what runs is exactly the argument list the builders return and the unit tests pin).
 */
import { spawn } from 'node:child_process';
import { settings } from '../env';
import { open, stat, writeFile } from 'node:fs/promises';
import { buildPeaksArgs, PEAKS_PCM_SAMPLE_RATE } from '~/lib/media/hls-ladder';
import { buildMonoPcmArgs } from '~/lib/media/pcm-args';
import { createPeaksAccumulator, encodePeaks, type Peaks } from '~/lib/media/peaks';
import {
  parseFfprobeJson,
  sniffContainer,
  type ProbeSummary,
  type UnreadableProbe,
} from '~/lib/media/probe-verdict';
import { createProgressParser, type FfmpegProgress } from '~/lib/media/progress';
import { parseIntegratedLoudness } from '~/lib/media/loudness';
import { buildMeasureArgs } from '~/lib/media/media-length';

/** Program paths (src/server/env.ts). */
export const FFMPEG_PATH = settings().FFMPEG_PATH;
export const FFPROBE_PATH = settings().FFPROBE_PATH;

/** A failed ffmpeg/ffprobe run, with the end of its stderr for the logs. */
export class FfmpegError extends Error {
  constructor(
    message: string,
    readonly exitCode: number | null,
    readonly stderrTail: string,
  ) {
    super(message);
    this.name = 'FfmpegError';
  }
}

/** Options of {@link runFfmpeg}. */
export interface RunOptions {
  /** Called at the end of each `-progress` block (the args must contain `-progress pipe:1`). */
  onProgress?: (progress: FfmpegProgress) => void;
  /** Duration of the output in seconds, needed for the percentage. */
  durationSeconds?: number;
  /** Aborting sends SIGTERM (ffmpeg exits cleanly) and SIGKILL 5 s later if it did not. */
  signal?: AbortSignal;
  /** Receives stdout bytes; when set, progress is not parsed (stdout carries data, e.g. PCM). */
  onStdout?: (chunk: Buffer) => void;
}

const STDERR_TAIL_BYTES = 8 * 1024;

/** Runs ffmpeg with exactly `args` (no shell); resolves on exit code 0, rejects with {@link FfmpegError} otherwise. */
export function runFfmpeg(args: readonly string[], options: RunOptions = {}): Promise<{ stderrTail: string }> {
  return runProcess(FFMPEG_PATH, args, options);
}

function runProcess(program: string, args: readonly string[], options: RunOptions): Promise<{ stderrTail: string }> {
  return new Promise((resolve, reject) => {
    if (options.signal?.aborted) {
      reject(abortError(options.signal));
      return;
    }
    const child = spawn(program, [...args], { stdio: ['ignore', 'pipe', 'pipe'] });
    let stderr = '';
    let killTimer: ReturnType<typeof setTimeout> | undefined;
    const parse = createProgressParser(options.durationSeconds ?? 0);

    child.stdout.on('data', (chunk: Buffer) => {
      if (options.onStdout) options.onStdout(chunk);
      else if (options.onProgress) for (const report of parse(chunk.toString('utf8'))) options.onProgress(report);
    });
    child.stderr.setEncoding('utf8');
    child.stderr.on('data', (chunk: string) => {
      stderr = (stderr + chunk).slice(-STDERR_TAIL_BYTES);
    });

    const onAbort = () => {
      child.kill('SIGTERM');
      killTimer = setTimeout(() => child.kill('SIGKILL'), 5000);
    };
    options.signal?.addEventListener('abort', onAbort, { once: true });

    child.on('error', (error) => {
      options.signal?.removeEventListener('abort', onAbort);
      reject(new FfmpegError(`could not start ${program}: ${error.message}`, null, ''));
    });
    child.on('close', (code, signalName) => {
      options.signal?.removeEventListener('abort', onAbort);
      if (killTimer) clearTimeout(killTimer);
      if (options.signal?.aborted) reject(abortError(options.signal));
      else if (code === 0) resolve({ stderrTail: stderr });
      else {
        // ffmpeg often ends with advice ("To ignore this, …"): keep the lines before it too.
        const lastLines = stderr.trim().split('\n').slice(-3).join(' / ');
        reject(new FfmpegError(`${program} failed (${code ?? signalName}): ${lastLines}`, code, stderr));
      }
    });
  });
}

function abortError(signal: AbortSignal): Error {
  return signal.reason instanceof Error ? signal.reason : new DOMException('ffmpeg run aborted', 'AbortError');
}

/**
 * Probes a file. ffprobe refusing the file is an answer, not an error: the result then says how
 * big the file is and which container its first bytes look like, for the verdict's reason.
 */
export async function probeFile(path: string): Promise<ProbeSummary | UnreadableProbe> {
  const args = ['-v', 'error', '-print_format', 'json', '-show_format', '-show_streams', path];
  let stdout = '';
  try {
    await runProcess(FFPROBE_PATH, args, {
      onStdout: (chunk) => {
        stdout += chunk.toString('utf8');
      },
    });
    return parseFfprobeJson(stdout);
  } catch (error) {
    if (!(error instanceof FfmpegError) || error.exitCode === null) throw error;
    const { size } = await stat(path);
    const head = await readHead(path, 16);
    return { unreadable: true, sizeBytes: size, header: sniffContainer(head, size), message: error.message };
  }
}

async function readHead(path: string, bytes: number): Promise<Uint8Array> {
  const handle = await open(path, 'r');
  try {
    const buffer = new Uint8Array(bytes);
    const { bytesRead } = await handle.read(buffer, 0, bytes, 0);
    return buffer.subarray(0, bytesRead);
  } finally {
    await handle.close();
  }
}

/**
 * Where the first video stream's last packet starts, in seconds, read without decoding (see
 * media-length.ts); null when no packet could be read.
 */
export async function lastVideoPacketSeconds(path: string, signal?: AbortSignal): Promise<number | null> {
  let last = 0;
  try {
    await runFfmpeg(buildMeasureArgs(path), {
      ...(signal ? { signal } : {}),
      onProgress: (p) => {
        last = Math.max(last, p.outTimeSeconds);
      },
    });
  } catch (error) {
    if (error instanceof FfmpegError && error.exitCode !== null) return null; // the packets cannot be read at all
    throw error;
  }
  return last > 0 ? last : null;
}

/** Options of {@link computeFilePeaks} and {@link readPeaks}. */
export interface PeaksReadOptions {
  /** The probed duration: peaks then cover exactly that (see buildPeaksArgs). */
  durationSeconds?: number;
  signal?: AbortSignal;
}

/**
 * Decodes the first audio stream and returns its peaks (streamed: memory stays small for long
 * classes). Rejects with {@link FfmpegError} when the file has no audio; use `silentPeaks` then.
 */
export async function computeFilePeaks(path: string, rate = 100, options: PeaksReadOptions = {}): Promise<Peaks> {
  return (await analyseAudio(path, rate, options)).peaks;
}

/**
 * One decode of the first audio stream gives both its peaks and its integrated loudness in LUFS
 * (ITU-R BS.1770-4 via ffmpeg's ebur128; null when nothing is above the gates).
 */
export async function analyseAudio(path: string, rate = 100, options: PeaksReadOptions = {}): Promise<{ peaks: Peaks; integratedLufs: number | null }> {
  const sampleRate = PEAKS_PCM_SAMPLE_RATE;
  const acc = createPeaksAccumulator(sampleRate, rate);
  let carry: Buffer | null = null; // an odd byte left between chunks
  const run: RunOptions = {
    onStdout: (chunk) => {
      const data: Buffer = carry ? Buffer.concat([carry, chunk]) : chunk;
      const usable = data.length - (data.length % 2);
      carry = usable < data.length ? data.subarray(usable) : null;
      // Copy into an aligned buffer: Int16Array views need an even byte offset.
      const samples = new Int16Array(usable / 2);
      for (let i = 0; i < samples.length; i++) samples[i] = data.readInt16LE(i * 2);
      acc.push(samples);
    },
  };
  if (options.signal) run.signal = options.signal;
  const args = options.durationSeconds === undefined
    ? buildPeaksArgs({ input: path, sampleRate })
    : buildPeaksArgs({ input: path, sampleRate, durationSeconds: options.durationSeconds });
  const { stderrTail } = await runFfmpeg(args, run);
  return { peaks: acc.finish(), integratedLufs: parseIntegratedLoudness(stderrTail) };
}

/** The encoded peaks file (see peaks.ts) for a recording's first audio stream. */
export async function readPeaks(path: string, rate = 100, options: PeaksReadOptions = {}): Promise<Uint8Array> {
  return encodePeaks(await computeFilePeaks(path, rate, options));
}

/**
 * Runs a command that comes with files to write first (the demo video's filter script).
 * The files are written before ffmpeg starts; the caller owns (and removes) their directory.
 */
export async function runFfmpegCommand(
  command: { args: readonly string[]; files: readonly { path: string; content: string }[] },
  options: RunOptions = {},
): Promise<{ stderrTail: string }> {
  for (const file of command.files) await writeFile(file.path, file.content, 'utf8');
  return runFfmpeg(command.args, options);
}

/**
 * Decodes the first audio stream to mono float samples at `sampleRate`, handing them over in
 * chunks as they arrive (memory stays small for long classes). Rejects with {@link FfmpegError}
 * when the file has no audio.
 */
export async function decodeMonoPcm(
  path: string,
  sampleRate: number,
  onSamples: (samples: Float32Array) => void,
  options: PeaksReadOptions = {},
): Promise<void> {
  let carry: Buffer | null = null; // bytes of a sample split between chunks
  const run: RunOptions = {
    onStdout: (chunk) => {
      const data: Buffer = carry ? Buffer.concat([carry, chunk]) : chunk;
      const usable = data.length - (data.length % 4);
      carry = usable < data.length ? Buffer.from(data.subarray(usable)) : null;
      // Copy into a fresh (aligned) buffer: Float32Array views need a byte offset divisible by 4.
      // f32le read as host order: every platform Node supports here is little-endian.
      const bytes = new Uint8Array(usable);
      bytes.set(data.subarray(0, usable));
      onSamples(new Float32Array(bytes.buffer));
    },
  };
  if (options.signal) run.signal = options.signal;
  const args = buildMonoPcmArgs(
    options.durationSeconds === undefined ? { input: path, sampleRate } : { input: path, sampleRate, durationSeconds: options.durationSeconds },
  );
  await runFfmpeg(args, run);
}

/** espeak-ng (Debian package), for generated coach voices in demo and test media. */
export const ESPEAK_PATH = settings().ESPEAK_PATH;

/** Speaks `text` into a WAV file (22.05 kHz mono). `voice` is an espeak-ng voice name such as `en` or `en+f3`. */
export async function speakToWav(text: string, path: string, options: { voice?: string; wordsPerMinute?: number; pitch?: number } = {}): Promise<void> {
  const args = ['-v', options.voice ?? 'en', '-s', String(options.wordsPerMinute ?? 170), '-p', String(options.pitch ?? 50), '-w', path, '--', text];
  await runProcess(ESPEAK_PATH, args, {});
}
