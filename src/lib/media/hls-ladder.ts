/**
 * ffmpeg commands as data for packaging a recording: the HLS rendition ladder, the one-pass
 * packaging command, the poster frame and the PCM decode the waveform peaks are computed from.
 * Pure: only the runner in src/server/media spawns processes.
 */
import type { RecordingFacts } from './probe-verdict';
import { BT709_OUTPUT_TAGS, sdrToneMapFilter, withToneMap } from './tone-map';

/** One HLS variant stream. Sizes are the encoded (displayed) size; bit rates in kbit/s. */
export interface Rendition {
  /** Short-side label, e.g. `720p`. */
  name: string;
  width: number;
  height: number;
  videoKbps: number;
  maxrateKbps: number;
  bufsizeKbps: number;
  audioKbps: number;
}

/** Packaging choices not taken from the probe. */
export interface LadderOptions {
  /** Frame rate ceiling: fitness classes gain nothing from 60 fps and the encode cost doubles. Default 30. */
  maxFrameRate?: number;
  /** Most renditions in the ladder. Default 3. */
  maxRenditions?: number;
}

/** Short-side sizes we offer; a source smaller than the top one gets its own size plus the smaller ones. */
export const LADDER_RUNGS = [1080, 720, 360, 240] as const;

/** Sample rate of the mono PCM the peaks are computed from: 80 samples per peak at 100 peaks/s. */
export const PEAKS_PCM_SAMPLE_RATE = 8000;

const DEFAULT_SEGMENT_SECONDS = 4;

/** Rounds to the nearest even integer (ties up), at least 2: x264 with 4:2:0 chroma needs even sizes. */
export function even(value: number): number {
  return Math.max(2, Math.round(value / 2) * 2);
}

function floorEven(value: number): number {
  return Math.max(2, Math.floor(value / 2) * 2);
}

/** Output frame rate: the source's rate rounded to a whole number and capped (fps filter makes it constant). */
export function outputFrameRate(facts: Pick<RecordingFacts, 'frameRate'>, options: LadderOptions = {}): number {
  const cap = options.maxFrameRate ?? 30;
  const source = facts.frameRate && Number.isFinite(facts.frameRate) && facts.frameRate > 0 ? facts.frameRate : 30;
  return Math.max(1, Math.min(cap, Math.round(source)));
}

/** Size of the picture scaled so that its short side is `shortSide`, aspect kept, both sides even. */
export function fitShortSide(source: { width: number; height: number }, shortSide: number): { width: number; height: number } {
  const landscape = source.width >= source.height;
  const sourceShort = landscape ? source.height : source.width;
  const sourceLong = landscape ? source.width : source.height;
  // At (or above) the source size keep the source, trimmed to even sizes: never above the source.
  if (shortSide >= sourceShort) return { width: floorEven(source.width), height: floorEven(source.height) };
  const short = even(shortSide);
  const long = even((shortSide * sourceLong) / sourceShort);
  return landscape ? { width: long, height: short } : { width: short, height: long };
}

/**
 * Chooses renditions, never above the source: 1080p/720p/360p for HD sources; smaller sources keep
 * their own size on top plus the standard rungs clearly below it (at most 85 % of its short side).
 */
export function chooseLadder(facts: Pick<RecordingFacts, 'width' | 'height' | 'frameRate'>, options: LadderOptions = {}): Rendition[] {
  const maxRenditions = options.maxRenditions ?? 3;
  const sourceShort = Math.min(facts.width, facts.height);
  const top = Math.min(sourceShort, LADDER_RUNGS[0]);
  const shorts = [top, ...LADDER_RUNGS.filter((rung) => rung <= top * 0.85)].slice(0, maxRenditions);
  const fps = outputFrameRate(facts, options);
  return shorts.map((short) => {
    const size = fitShortSide(facts, short);
    const videoKbps = videoBitrateKbps(size.width, size.height, fps);
    return {
      name: `${Math.min(size.width, size.height)}p`,
      ...size,
      videoKbps,
      maxrateKbps: roundTo(videoKbps * 1.07, 50),
      bufsizeKbps: roundTo(videoKbps * 1.5, 50),
      audioKbps: Math.min(size.width, size.height) >= 720 ? 128 : 96,
    };
  });
}

/**
 * Video bit rate for a size: 0.08 bit per pixel at 1080p30, with more bits per pixel for small
 * pictures (fourth-root rule), which lands near common ladders (≈5000/2700/950 kbit/s for 1080/720/360p).
 */
function videoBitrateKbps(width: number, height: number, fps: number): number {
  const pixels = width * height;
  const bitsPerPixel = 0.08 * Math.pow((1920 * 1080) / pixels, 0.25);
  return Math.max(200, roundTo((pixels * fps * bitsPerPixel) / 1000, 50));
}

function roundTo(value: number, step: number): number {
  return Math.round(value / step) * step;
}

/** Input of {@link buildPackageArgs}. */
export interface PackageArgsInput {
  /** Source file path (or URL ffmpeg can read). */
  input: string;
  /** Directory that receives `master.m3u8` and `v<N>/index.m3u8` + `v<N>/seg_NNN.ts`. Must not contain `%`. */
  outputDir: string;
  /** The accepted probe facts (see probeVerdict). */
  probe: Pick<RecordingFacts, 'width' | 'height' | 'frameRate' | 'hasAudio' | 'colorTransfer'>;
  /** Segment length in whole seconds, 4–6. Default 4. */
  segmentSeconds?: number;
  /** x264 preset. Default `veryfast` (about 1.3× real time for a 1080p ladder on 2 cores, see facts.md). */
  preset?: string;
  /** Ladder override (tests, demo media); default {@link chooseLadder}. */
  ladder?: Rendition[];
  ladderOptions?: LadderOptions;
}

/** Paths (relative to the output directory) that one packaging run writes. */
export function packageOutputs(renditionCount: number): { master: string; playlists: string[] } {
  return {
    master: 'master.m3u8',
    playlists: Array.from({ length: renditionCount }, (_, i) => `v${i}/index.m3u8`),
  };
}

/**
 * The argument list (without the `ffmpeg` program name) for ONE run that decodes the source once,
 * splits the picture per rendition, and writes an HLS VOD ladder with keyframes aligned on segment
 * boundaries in every rendition. Progress goes to stdout as `-progress` key=value lines.
 */
export function buildPackageArgs(options: PackageArgsInput): string[] {
  const segmentSeconds = options.segmentSeconds ?? DEFAULT_SEGMENT_SECONDS;
  if (!Number.isInteger(segmentSeconds) || segmentSeconds < 4 || segmentSeconds > 6) {
    throw new RangeError(`segmentSeconds must be a whole number from 4 to 6, got ${segmentSeconds}`);
  }
  if (options.outputDir.includes('%')) throw new Error('outputDir must not contain % (ffmpeg reads it as a pattern)');
  const out = trimSlash(options.outputDir);
  const ladder = options.ladder ?? chooseLadder(options.probe, options.ladderOptions);
  if (ladder.length === 0) throw new Error('the ladder needs at least one rendition');
  const fps = outputFrameRate(options.probe, options.ladderOptions);
  // One keyframe per segment, at the same frame numbers in every rendition: segments cut identically.
  const gop = String(segmentSeconds * fps);
  const audio = options.probe.hasAudio;

  const labels = ladder.map((_, i) => `[s${i}]`).join('');
  const scales = ladder.map((r, i) => `[s${i}]scale=${r.width}:${r.height}[v${i}]`);
  // fps= makes variable-frame-rate phone footage constant so -g lands exactly on segment boundaries.
  // HDR sources are tone-mapped to BT.709 once, before the split: every rendition gets the mapped picture.
  const filter = [`[0:v:0]${withToneMap(options.probe.colorTransfer, `fps=${fps},format=yuv420p,split=${ladder.length}${labels}`)}`, ...scales].join(';');
  const toneMapped = sdrToneMapFilter(options.probe.colorTransfer) !== null;

  const args = ['-hide_banner', '-nostdin', '-y', '-loglevel', 'error', '-nostats', '-progress', 'pipe:1'];
  args.push('-i', options.input, '-filter_complex', filter);
  ladder.forEach((_, i) => {
    args.push('-map', `[v${i}]`);
    if (audio) args.push('-map', '0:a:0');
  });
  args.push('-c:v', 'libx264', '-preset', options.preset ?? 'veryfast', '-profile:v', 'high');
  args.push('-g', gop, '-keyint_min', gop, '-sc_threshold', '0');
  if (toneMapped) args.push(...BT709_OUTPUT_TAGS);
  ladder.forEach((r, i) => {
    args.push(`-b:v:${i}`, `${r.videoKbps}k`, `-maxrate:v:${i}`, `${r.maxrateKbps}k`, `-bufsize:v:${i}`, `${r.bufsizeKbps}k`);
  });
  if (audio) {
    args.push('-c:a', 'aac', '-ac', '2', '-ar', '48000');
    ladder.forEach((r, i) => args.push(`-b:a:${i}`, `${r.audioKbps}k`));
  }
  const streamMap = ladder.map((_, i) => (audio ? `v:${i},a:${i}` : `v:${i}`)).join(' ');
  args.push(
    '-f', 'hls',
    '-hls_time', String(segmentSeconds),
    '-hls_playlist_type', 'vod',
    '-hls_flags', 'independent_segments',
    '-hls_segment_type', 'mpegts',
    '-hls_segment_filename', `${out}/v%v/seg_%03d.ts`,
    '-master_pl_name', 'master.m3u8',
    // One array item holding spaces: never split it (facts.md pitfall).
    '-var_stream_map', streamMap,
    `${out}/v%v/index.m3u8`,
  );
  return args;
}

/** Input of {@link buildPosterArgs}. */
export interface PosterArgsInput {
  input: string;
  /** Output JPEG path. */
  output: string;
  probe: Pick<RecordingFacts, 'width' | 'height' | 'durationSeconds' | 'colorTransfer'>;
  /** Where to take the frame, as a fraction of the duration. Default 0.1 (past intros and black frames). */
  atFraction?: number;
  /** Short side of the poster, never above the source. Default 720. */
  shortSide?: number;
}

/** Arguments for one JPEG poster frame. Seeking before `-i` is fast and frame-accurate for re-encoding. */
export function buildPosterArgs(options: PosterArgsInput): string[] {
  const at = Math.max(0, options.probe.durationSeconds * (options.atFraction ?? 0.1));
  const short = Math.min(options.shortSide ?? 720, Math.min(options.probe.width, options.probe.height));
  const size = fitShortSide(options.probe, short);
  return [
    '-hide_banner', '-nostdin', '-y', '-loglevel', 'error',
    '-ss', at.toFixed(3),
    '-i', options.input,
    '-map', '0:v:0',
    '-frames:v', '1',
    '-vf', withToneMap(options.probe.colorTransfer, `scale=${size.width}:${size.height}`),
    '-q:v', '3',
    '-f', 'image2', '-update', '1',
    options.output,
  ];
}

/**
 * Arguments that measure the first audio stream's integrated loudness (see loudness.ts) and decode it to mono signed 16-bit little-endian PCM at
 * `sampleRate` on stdout, for computing waveform peaks without writing a temporary file.
 * Pass the probed duration: ffmpeg 5.1 decodes AAC's end padding (≈11 ms here) that the MP4
 * edit list trims from the duration, and `-t` cuts it so peaks match the video exactly.
 */
export function buildPeaksArgs(options: { input: string; sampleRate?: number; durationSeconds?: number }): string[] {
  const rate = options.sampleRate ?? PEAKS_PCM_SAMPLE_RATE;
  const limit = options.durationSeconds !== undefined && options.durationSeconds > 0 ? ['-t', options.durationSeconds.toFixed(6)] : [];
  return [
    // Info level for the loudness summary ebur128 prints at the end (its per-frame lines go at verbose).
    '-hide_banner', '-nostdin', '-nostats', '-loglevel', 'info',
    '-i', options.input,
    '-map', '0:a:0', '-vn',
    // Integrated loudness (ITU-R BS.1770-4 / EBU R 128) in the same decode, on the original channels and rate.
    '-af', 'ebur128=framelog=verbose',
    '-ac', '1', '-ar', String(rate),
    ...limit,
    '-c:a', 'pcm_s16le', '-f', 's16le',
    'pipe:1',
  ];
}

function trimSlash(path: string): string {
  return path.length > 1 ? path.replace(/\/+$/, '') : path;
}
