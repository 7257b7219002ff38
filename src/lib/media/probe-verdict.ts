/**
 * Decides whether a probed upload can become lesson media, with reasons a coach can act on.
 * Pure: ffprobe's JSON (or the fact that ffprobe could not read the file) goes in, a verdict comes out.
 */
import { EBU_R128_TARGET_LUFS } from './loudness';
import { LENGTH_MISMATCH_SECONDS, TRUNCATED_SHARE } from './media-length';

/** One stream as the pipeline cares about it; everything else ffprobe says is dropped on purpose. */
export interface ProbeStream {
  type: 'video' | 'audio' | 'subtitle' | 'data' | 'attachment' | 'other';
  codec: string;
  /** Displayed width (already swapped for 90°/270° rotated phone recordings). */
  width?: number;
  height?: number;
  /** Average frames per second, when ffprobe knows it. */
  frameRate?: number;
  /** Frame count from the container index (MP4/MOV know it; Matroska usually does not). */
  frames?: number;
  /** Bits per second of this stream from the container index (MP4/MOV). */
  bitRate?: number;
  channels?: number;
  /** Cover art in audio files shows up as a one-picture "video" stream: it is not a video track. */
  attachedPicture?: boolean;
  /** Transfer characteristics (`bt709`, `arib-std-b67` = HLG, `smpte2084` = PQ), when tagged. */
  colorTransfer?: string;
}

/** The narrow summary of `ffprobe -show_format -show_streams` that the rest of the pipeline uses. */
export interface ProbeSummary {
  /** Container duration in seconds; null when ffprobe could not tell (typical of cut-off files). */
  durationSeconds: number | null;
  /** ffprobe's `format_name`, e.g. `mov,mp4,m4a,3gp,3g2,mj2` or `matroska,webm`. */
  formatName: string;
  /** File size in bytes when ffprobe reports it. */
  sizeBytes?: number;
  streams: ProbeStream[];
}

/** What we know when ffprobe refused the file outright (exit code ≠ 0). */
export interface UnreadableProbe {
  unreadable: true;
  sizeBytes: number;
  /** Container family recognised from the first bytes (see {@link sniffContainer}). */
  header: ContainerSniff;
  /** ffprobe's last error line, kept for logs (not shown to the coach). */
  message: string;
}

/** Container family recognised from a file's first bytes. */
export type ContainerSniff = 'empty' | 'mp4' | 'matroska' | 'unknown';

/** Facts about an accepted recording, exactly what packaging needs. */
export interface RecordingFacts {
  durationSeconds: number;
  width: number;
  height: number;
  /** Average frame rate; 30 is assumed by packaging when unknown. */
  frameRate?: number;
  hasAudio: boolean;
  videoCodec: string;
  audioCodec?: string;
  /** What the container claims, when it differs from `durationSeconds` (or says nothing: null). */
  containerSeconds?: number | null;
  /** The picture's transfer characteristics; HDR ones are tone-mapped when packaging. */
  colorTransfer?: string;
}

/** The verdict: either usable (maybe with warnings) or refused with one plain-language reason. */
export type ProbeVerdict =
  | { ok: true; warnings: string[]; summary: RecordingFacts }
  | { ok: false; reason: string };

/** Options that need more than ffprobe's header reading. */
export interface VerdictOptions {
  /** Loudest audio level in dBFS (e.g. from the peaks); at or below {@link SILENT_AUDIO_DB} the audio counts as silent. */
  audioPeakDb?: number;
  /** Minimum recording length in seconds (10 s per issue 4). */
  minDurationSeconds?: number;
  /**
   * The length the video packets really cover (see media-length.ts); null when none could be
   * read. When given, it is the length used, and the container's claim is only compared with it.
   */
  measuredSeconds?: number | null;
}

/** Audio whose loudest sample stays at or below this level is treated as silent. */
export const SILENT_AUDIO_DB = -60;

/** Reasons shown to coaches. Exported so tests and the UI use the very same words. */
export const REASONS = {
  empty: 'The file is empty (0 bytes): the upload did not go through. Please upload the recording again.',
  notVideo:
    'We could not read this file as a video. Export the recording as MP4 (H.264), MOV, WebM or MKV and upload it again.',
  container: (name: string) =>
    `This file type (${name}) is not supported. Export the recording as MP4 (H.264), MOV, WebM or MKV and upload it again.`,
  photo: (kind: string) =>
    `This file is a photo (${kind}), not a video. Upload the video recording of the class as MP4, MOV, WebM or MKV.`,
  noVideo: 'This file has no picture, only sound. Upload the video recording of the class, not only its sound.',
  truncated:
    'The file ends early: it looks truncated. Copy or export it again from the camera or editing app and upload it once more.',
  tooShort: (seconds: number, min: number) =>
    `This recording is only ${formatSeconds(seconds)} long; a class recording needs at least ${min} seconds.`,
} as const;

/** Warnings shown next to an accepted recording. */
export const WARNINGS = {
  noAudio: 'This recording has no sound track: members will watch it without sound.',
  silentAudio: 'The sound track of this recording is silent: check the microphone before the next recording.',
  cutShort: (realSeconds: number, claimedSeconds: number) =>
    `The file says it is ${formatLength(claimedSeconds)} long, but its picture stops at ${formatLength(realSeconds)}: ` +
    `the end is missing (the copy or export was cut off). The class uses the ${formatLength(realSeconds)} that are there; ` +
    'upload a complete copy if the end matters.',
  quiet: (lufs: number) =>
    `The sound of this recording is very quiet (${lufs.toFixed(0)} LUFS; classes are easy to follow near ${EBU_R128_TARGET_LUFS} LUFS), ` +
    'so members will have to turn their volume far up. The waveform is shown louder so you can still mark it. ' +
    'Before the next recording, put the microphone closer or raise its level.',
} as const;

/** Photo formats as ffprobe names them; a photo renamed .mp4 is read as one of these. */
const PHOTO_FORMATS: Record<string, string> = {
  jpeg_pipe: 'JPEG',
  png_pipe: 'PNG',
  webp_pipe: 'WebP',
  gif: 'GIF',
  gif_pipe: 'GIF',
  bmp_pipe: 'BMP',
  tiff_pipe: 'TIFF',
  heif: 'HEIF',
  image2: 'picture',
};

// ffprobe lists every name a demuxer answers to; these demuxers cover MP4, MOV, WebM and MKV.
const ACCEPTED_FORMAT_NAMES = new Set(['mov', 'mp4', 'matroska', 'webm']);

/**
 * Recognises the container family from the first bytes of a file, so that an unreadable MP4
 * (cut off before its index) can be told apart from a file that was never a video.
 */
export function sniffContainer(head: Uint8Array, sizeBytes: number = head.length): ContainerSniff {
  if (sizeBytes === 0) return 'empty';
  // ISO BMFF (MP4/MOV): a box size then a four-character type; real files start with ftyp, or
  // with free/wide/mdat/moov when written by older QuickTime tools.
  if (head.length >= 8) {
    const type = String.fromCharCode(head[4] ?? 0, head[5] ?? 0, head[6] ?? 0, head[7] ?? 0);
    if (['ftyp', 'moov', 'mdat', 'free', 'wide', 'skip'].includes(type)) return 'mp4';
  }
  // Matroska and WebM start with the EBML magic number.
  if (head[0] === 0x1a && head[1] === 0x45 && head[2] === 0xdf && head[3] === 0xa3) return 'matroska';
  return 'unknown';
}

/**
 * Whether the packets are worth measuring: a readable file in a video container with a picture.
 * Photos, documents and sound-only files are refused from the header alone.
 */
export function needsMeasuring(probe: ProbeSummary | UnreadableProbe): probe is ProbeSummary {
  if ('unreadable' in probe) return false;
  const names = probe.formatName.split(',').map((n) => n.trim());
  if (names.some((n) => PHOTO_FORMATS[n]) || !names.some((n) => ACCEPTED_FORMAT_NAMES.has(n))) return false;
  return probe.streams.some((s) => s.type === 'video' && !s.attachedPicture);
}

/**
 * Judges a probe result. Order matters: the first problem a coach can fix is the one we report.
 */
export function probeVerdict(probe: ProbeSummary | UnreadableProbe, options: VerdictOptions = {}): ProbeVerdict {
  const minDuration = options.minDurationSeconds ?? 10;
  if ('unreadable' in probe) {
    if (probe.sizeBytes === 0 || probe.header === 'empty') return { ok: false, reason: REASONS.empty };
    // A file that starts like a video container but cannot be opened lost its end (MP4 keeps its
    // index at the end unless written with faststart).
    if (probe.header === 'mp4' || probe.header === 'matroska') return { ok: false, reason: REASONS.truncated };
    return { ok: false, reason: REASONS.notVideo };
  }

  const names = probe.formatName.split(',').map((n) => n.trim());
  const photo = names.map((n) => PHOTO_FORMATS[n]).find(Boolean);
  if (photo) return { ok: false, reason: REASONS.photo(photo) };
  if (!names.some((n) => ACCEPTED_FORMAT_NAMES.has(n))) {
    return { ok: false, reason: REASONS.container(names[0] || 'unknown') };
  }

  const video = probe.streams.find((s) => s.type === 'video' && !s.attachedPicture);
  if (!video) return { ok: false, reason: REASONS.noVideo };

  const claimed = probe.durationSeconds !== null && Number.isFinite(probe.durationSeconds) && probe.durationSeconds > 0 ? probe.durationSeconds : null;
  const measured = options.measuredSeconds;
  if (video.frames === 0) return { ok: false, reason: REASONS.truncated };
  if (!video.width || !video.height) return { ok: false, reason: REASONS.truncated };
  const warnings: string[] = [];
  let duration: number;
  let containerSeconds: number | null | undefined;
  if (measured === undefined) {
    // Not measured (callers that only read the header): the container's word is all there is.
    if (claimed === null) return { ok: false, reason: REASONS.truncated };
    duration = claimed;
  } else {
    // The packets decide; a container without a duration (browser WebM) is fine.
    if (measured === null || measured <= 0) return { ok: false, reason: REASONS.truncated };
    duration = measured;
    if (claimed === null) containerSeconds = null;
    else if (Math.abs(claimed - measured) > LENGTH_MISMATCH_SECONDS) {
      if (measured < claimed * TRUNCATED_SHARE) return { ok: false, reason: REASONS.truncated };
      containerSeconds = claimed;
      warnings.push(WARNINGS.cutShort(measured, claimed));
    } else duration = claimed; // within a second: keep the container's exact figure
  }

  if (duration < minDuration) return { ok: false, reason: REASONS.tooShort(duration, minDuration) };

  // MP4/MOV index every sample, so the streams' bit rates times the duration give the bytes the
  // media data should take; a file much smaller than that was cut off after its index (faststart files).
  const indexedBits = probe.streams.reduce((sum, s) => sum + (s.bitRate ?? 0), 0);
  if (probe.sizeBytes !== undefined && indexedBits > 0 && names.includes('mov')) {
    const expectedBytes = (indexedBits * (claimed ?? duration)) / 8;
    if (probe.sizeBytes < expectedBytes * 0.9) return { ok: false, reason: REASONS.truncated };
  }

  const audio = probe.streams.find((s) => s.type === 'audio');
  if (!audio) warnings.push(WARNINGS.noAudio);
  else if (options.audioPeakDb !== undefined && options.audioPeakDb <= SILENT_AUDIO_DB) warnings.push(WARNINGS.silentAudio);

  const summary: RecordingFacts = {
    durationSeconds: duration,
    width: video.width,
    height: video.height,
    hasAudio: audio !== undefined,
    videoCodec: video.codec,
  };
  if (video.frameRate !== undefined) summary.frameRate = video.frameRate;
  if (audio) summary.audioCodec = audio.codec;
  if (containerSeconds !== undefined) summary.containerSeconds = containerSeconds;
  if (video.colorTransfer) summary.colorTransfer = video.colorTransfer;
  return { ok: true, warnings, summary };
}

/**
 * Turns the output of `ffprobe -print_format json -show_format -show_streams` (already parsed or as text)
 * into a {@link ProbeSummary}. Unknown or malformed fields are dropped rather than guessed.
 */
export function parseFfprobeJson(json: unknown): ProbeSummary {
  const root = asRecord(typeof json === 'string' ? (JSON.parse(json) as unknown) : json);
  const format = asRecord(root.format);
  const rawStreams = Array.isArray(root.streams) ? root.streams : [];
  const streams = rawStreams.map((s) => parseStream(asRecord(s)));

  let duration = toNumber(format.duration);
  if (duration === undefined) {
    // Some containers only carry per-stream durations.
    const perStream = rawStreams.map((s) => toNumber(asRecord(s).duration)).filter((d): d is number => d !== undefined);
    duration = perStream.length > 0 ? Math.max(...perStream) : undefined;
  }
  const summary: ProbeSummary = {
    durationSeconds: duration ?? null,
    formatName: typeof format.format_name === 'string' ? format.format_name : '',
    streams,
  };
  const size = toNumber(format.size);
  if (size !== undefined) summary.sizeBytes = size;
  return summary;
}

function parseStream(s: Record<string, unknown>): ProbeStream {
  const kind = s.codec_type;
  const type: ProbeStream['type'] =
    kind === 'video' || kind === 'audio' || kind === 'subtitle' || kind === 'data' || kind === 'attachment' ? kind : 'other';
  const stream: ProbeStream = { type, codec: typeof s.codec_name === 'string' ? s.codec_name : 'unknown' };
  let width = toNumber(s.width);
  let height = toNumber(s.height);
  // Phones store portrait video as landscape plus a rotation; players (and ffmpeg's autorotate) show it turned.
  const rotation = readRotation(s);
  if (width !== undefined && height !== undefined && Math.abs(rotation) % 180 === 90) [width, height] = [height, width];
  if (width !== undefined && width > 0) stream.width = width;
  if (height !== undefined && height > 0) stream.height = height;
  const rate = parseRational(s.avg_frame_rate) ?? parseRational(s.r_frame_rate);
  if (type === 'video' && rate !== undefined) stream.frameRate = rate;
  const frames = toNumber(s.nb_frames);
  if (frames !== undefined) stream.frames = frames;
  const bitRate = toNumber(s.bit_rate);
  if (bitRate !== undefined) stream.bitRate = bitRate;
  const channels = toNumber(s.channels);
  if (channels !== undefined) stream.channels = channels;
  if (asRecord(s.disposition).attached_pic === 1) stream.attachedPicture = true;
  if (typeof s.color_transfer === 'string' && s.color_transfer !== 'unknown') stream.colorTransfer = s.color_transfer;
  return stream;
}

function readRotation(s: Record<string, unknown>): number {
  const sideData = Array.isArray(s.side_data_list) ? s.side_data_list : [];
  for (const item of sideData) {
    const r = toNumber(asRecord(item).rotation);
    if (r !== undefined) return r;
  }
  return toNumber(asRecord(s.tags).rotate) ?? 0;
}

/** ffprobe writes rates as "30000/1001" and "0/0" when unknown. */
function parseRational(value: unknown): number | undefined {
  if (typeof value !== 'string') return undefined;
  const [num, den] = value.split('/').map(Number);
  if (num === undefined || !Number.isFinite(num) || num <= 0) return undefined;
  if (den === undefined) return num;
  return Number.isFinite(den) && den > 0 ? num / den : undefined;
}

/** ffprobe's JSON writes most numbers as strings, and "N/A" when it does not know. */
function toNumber(value: unknown): number | undefined {
  if (typeof value === 'number') return Number.isFinite(value) ? value : undefined;
  if (typeof value !== 'string' || value.trim() === '') return undefined;
  const n = Number(value);
  return Number.isFinite(n) ? n : undefined;
}

function asRecord(value: unknown): Record<string, unknown> {
  return value !== null && typeof value === 'object' && !Array.isArray(value) ? (value as Record<string, unknown>) : {};
}

/** m:ss.s, as coaches read a length with its tenth (28.47 s → 0:28.5). */
function formatLength(seconds: number): string {
  const tenths = Math.round(seconds * 10);
  const m = Math.floor(tenths / 600);
  const s = (tenths % 600) / 10;
  return `${m}:${s < 10 ? '0' : ''}${s.toFixed(1)}`;
}

function formatSeconds(seconds: number): string {
  return `${Math.round(seconds * 10) / 10} s`;
}
