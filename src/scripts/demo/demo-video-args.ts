/**
 * ffmpeg commands as data for demo recordings: one solid-colour span per planned part with large
 * text naming it, a short 1 kHz tone at the start of every span over quiet noise, x264 + AAC in MP4.
 *
 * The whole graph goes into a filter script file (returned as content for the runner to write):
 * a 60-span class would otherwise need a ~20 KB command line. Each span is its own small
 * `color` + `drawtext` and `aevalsrc` source joined by `concat`, so every expression stays
 * per-span and cheap (one comparison per sample) however long the class is.
 */

/** One span of the demo recording. */
export interface DemoSpan {
  /** Text shown, e.g. `WORK  Goblet squat  round 2/4`. Any characters; escaped here. */
  label: string;
  seconds: number;
  /** Background colour `#RRGGBB`. */
  color: string;
  /** The marked part it shows (absent for the lead-in before the first mark), for the soundtrack. */
  part?: { kind: string; exercise?: string | undefined };
}

/** Input of {@link buildDemoVideoArgs}. */
export interface DemoVideoInput {
  spans: readonly DemoSpan[];
  /** Output MP4 path. */
  output: string;
  /** Directory for the filter script file (the runner writes `files` there first). */
  workDir: string;
  width?: number;
  height?: number;
  fps?: number;
  fontFile?: string;
  /** Tone length in seconds at each span start. Default 0.15. */
  toneSeconds?: number;
  toneHz?: number;
  /**
   * A soundtrack to use instead of the tones: raw mono 32-bit float PCM at `sampleRate`, at least
   * as long as the spans (see server/media/render-soundtrack.ts).
   */
  audio?: { path: string; sampleRate: number };
}

/** A span placed on the frame grid, as it will appear in the file. */
export interface PlacedSpan {
  label: string;
  startSeconds: number;
  endSeconds: number;
  frames: number;
}

/** Everything the runner needs: write `files`, then run ffmpeg with `args`. */
export interface DemoVideoCommand {
  args: string[];
  files: { path: string; content: string }[];
  /** Spans with frame-aligned times: these are the true boundaries (and tone times) in the output. */
  spans: PlacedSpan[];
  durationSeconds: number;
}

export const DEMO_FONT_FILE = '/usr/share/fonts/truetype/dejavu/DejaVuSans-Bold.ttf';
const AUDIO_RATE = 48000;
const INK = '0x172033';
const CHALK = '0xFFFFFF';

/**
 * Places spans on the frame grid: span boundaries are the cumulative nominal times rounded to
 * whole frames, so rounding never accumulates over a long class.
 */
export function placeDemoSpans(spans: readonly Pick<DemoSpan, 'label' | 'seconds'>[], fps: number): PlacedSpan[] {
  let nominal = 0;
  let startFrame = 0;
  return spans.map((span) => {
    if (!(span.seconds > 0)) throw new RangeError(`span "${span.label}" must last more than 0 s`);
    nominal += span.seconds;
    const endFrame = Math.round(nominal * fps);
    const frames = endFrame - startFrame;
    if (frames < 1) throw new RangeError(`span "${span.label}" is shorter than one frame`);
    const placed = { label: span.label, startSeconds: startFrame / fps, endSeconds: endFrame / fps, frames };
    startFrame = endFrame;
    return placed;
  });
}

/**
 * Escapes a value for a filter option inside a filtergraph (two parsing levels, see ffmpeg's
 * "Notes on filtergraph escaping"): first the option level (quote it, `'` written as `'\''`),
 * then the graph level (backslash before `\ ' [ ] , ;`). With `expansion=none` drawtext itself
 * treats `%` and `\` literally, so no third level is needed.
 */
export function escapeFilterValue(value: string): string {
  const optionLevel = `'${value.replace(/'/g, `'\\''`)}'`;
  return optionLevel.replace(/[\\'[\],;]/g, (c) => `\\${c}`);
}

/** `#RRGGBB` to ffmpeg's `0xRRGGBB`; throws on anything else so a typo cannot reach ffmpeg. */
export function ffmpegColor(hex: string): string {
  if (!/^#[0-9a-fA-F]{6}$/.test(hex)) throw new Error(`colour must be #RRGGBB, got "${hex}"`);
  return `0x${hex.slice(1).toUpperCase()}`;
}

/** Ink text on light backgrounds, chalk on dark ones (relative luminance per WCAG 2.2). */
export function textColorFor(hex: string): string {
  const channel = (i: number) => {
    const c = Number.parseInt(hex.slice(1 + i * 2, 3 + i * 2), 16) / 255;
    return c <= 0.04045 ? c / 12.92 : Math.pow((c + 0.055) / 1.055, 2.4);
  };
  const luminance = 0.2126 * channel(0) + 0.7152 * channel(1) + 0.0722 * channel(2);
  // Contrast against white vs against ink (#172033, luminance ≈ 0.0146): pick the larger.
  const withWhite = 1.05 / (luminance + 0.05);
  const withInk = (luminance + 0.05) / (0.0146 + 0.05);
  return withWhite >= withInk ? CHALK : INK;
}

/** Font size that fits the label on one line (DejaVu Sans Bold averages under 0.68 em per character). */
export function demoFontSize(label: string, width: number, height: number): number {
  const byHeight = height / 8;
  const byWidth = (0.9 * width) / (Math.max(1, [...label].length) * 0.68);
  return Math.max(12, Math.floor(Math.min(byHeight, byWidth)));
}

/** The drawtext filter (with its arguments) that writes `label` centred on the picture. */
export function drawtextFilter(label: string, options: { width: number; height: number; color: string; fontFile: string }): string {
  // Control characters (newlines, tabs) would end up as boxes: show them as spaces.
  // eslint-disable-next-line no-control-regex -- matching control characters is the point here
  const text = label.replace(/[\u0000-\u001f\u007f]/g, ' ');
  const size = demoFontSize(text, options.width, options.height);
  return [
    `drawtext=fontfile=${escapeFilterValue(options.fontFile)}`,
    'expansion=none',
    `text=${escapeFilterValue(text)}`,
    `fontsize=${size}`,
    `fontcolor=${options.color}`,
    'x=(w-text_w)/2',
    'y=(h-text_h)/2',
  ].join(':');
}

/**
 * Builds the command for a demo recording. Spans are frame-aligned (see {@link placeDemoSpans});
 * audio spans have exactly the same length, so tones start on the frame that starts each span.
 */
export function buildDemoVideoArgs(input: DemoVideoInput): DemoVideoCommand {
  if (input.spans.length === 0) throw new Error('a demo recording needs at least one span');
  const width = input.width ?? 854;
  const height = input.height ?? 480;
  const fps = input.fps ?? 30;
  const fontFile = input.fontFile ?? DEMO_FONT_FILE;
  const toneSeconds = input.toneSeconds ?? 0.15;
  const toneHz = input.toneHz ?? 1000;
  if (width % 2 !== 0 || height % 2 !== 0) throw new RangeError('width and height must be even');
  const placed = placeDemoSpans(input.spans, fps);

  const chains: string[] = [];
  const pads: string[] = [];
  placed.forEach((span, i) => {
    const source = input.spans[i] as DemoSpan;
    // Durations are cut down to whole microseconds so the sources stop on the intended frame/sample
    // (they stop at the first timestamp ≥ d, rounded to microseconds).
    const d = (Math.floor((span.frames / fps) * 1e6) / 1e6).toFixed(6);
    const color = ffmpegColor(source.color);
    const text = drawtextFilter(source.label, { width, height, color: textColorFor(source.color), fontFile });
    chains.push(`color=c=${color}:s=${width}x${height}:r=${fps}:d=${d},format=yuv420p,${text}[v${i}]`);
    if (input.audio) {
      pads.push(`[v${i}]`);
      return;
    }
    // Time-gated tone (exact to the sample, unlike volume with eval=frame) over noise at -40 dBFS.
    chains.push(
      `aevalsrc=exprs=0.5*sin(2*PI*${toneHz}*t)*lt(t\\,${toneSeconds})+0.01*(2*random(0)-1):s=${AUDIO_RATE}:c=mono:d=${d}[a${i}]`,
    );
    pads.push(`[v${i}][a${i}]`);
  });
  chains.push(`${pads.join('')}concat=n=${placed.length}:v=1:a=${input.audio ? 0 : 1}[v]${input.audio ? '' : '[a]'}`);
  const last = placed[placed.length - 1] as PlacedSpan;
  const scriptPath = `${trimSlash(input.workDir)}/demo-filter.txt`;
  const script = `${chains.join(';\n')}\n`;

  const args = [
    '-hide_banner', '-nostdin', '-y', '-loglevel', 'error', '-nostats', '-progress', 'pipe:1',
    ...(input.audio ? ['-f', 'f32le', '-ar', String(input.audio.sampleRate), '-ac', '1', '-i', input.audio.path] : []),
    '-filter_complex_script', scriptPath,
    '-map', '[v]', '-map', input.audio ? '0:a' : '[a]',
    // The soundtrack may run a few samples past the last frame: stop with the picture.
    ...(input.audio ? ['-t', last.endSeconds.toFixed(6)] : []),
    '-c:v', 'libx264', '-preset', 'ultrafast', '-tune', 'stillimage', '-pix_fmt', 'yuv420p', '-r', String(fps),
    '-c:a', 'aac', '-b:a', '96k', '-ar', String(AUDIO_RATE),
    '-movflags', '+faststart',
    input.output,
  ];
  return { args, files: [{ path: scriptPath, content: script }], spans: placed, durationSeconds: last.endSeconds };
}

function trimSlash(path: string): string {
  return path.length > 1 ? path.replace(/\/+$/, '') : path;
}
