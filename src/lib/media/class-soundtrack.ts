/**
 * An invented class soundtrack with known truth, for tests, benchmarks and demo media: a music
 * bed with a beat, a coach talking through the parts, chatter in the room, and the signal the
 * coach uses at every change — timer beeps, a whistle, or a spoken count. The coach drifts from
 * the plan (each part a little long or short, one round break long) and may talk before the
 * warm-up. Pure: the score says what sounds where; {@link mixSoundtrack} renders it, given the
 * spoken clips (made elsewhere with a speech synthesiser).
 */
import type { PlannedSegment } from '../plan/expand-plan';

export type ChangeSignal = 'beeps' | 'whistle' | 'count';

export interface SoundtrackOptions {
  signal: ChangeSignal;
  /** Seed of the drift, the chatter and the count's timing. */
  seed: number;
  /** Each part runs up to this many seconds long or short (uniform). Default 1.5. */
  driftSeconds?: number;
  /** Index of the round break that runs long (0-based among round breaks) and by how much. Default 0 and 8 s. */
  longBreak?: { index: number; extraSeconds: number } | null;
  /** Unplanned talk before the warm-up, seconds. Default 20. */
  leadInSeconds?: number;
  /** Seconds of room after the last part. Default 6. */
  tailSeconds?: number;
  /** Pitch of the timer beeps, Hz. Default 1000. */
  beepHz?: number;
  /** Indexes of boundaries where the coach gives no signal (forgot the timer, say). Default none. */
  silentBoundaries?: readonly number[];
  /**
   * The coach talks in every part of 6 s or more and names the exercise (demo recordings);
   * otherwise only in parts of 12 s or more, with shorter lines (the accuracy fixtures).
   */
  talkative?: boolean;
}

export interface SpokenLine {
  atSeconds: number;
  text: string;
  voice: 'coach' | 'chatter';
  /** Level of the clip relative to its own peak, dB. */
  gainDb: number;
}

export interface SoundtrackScore {
  durationSeconds: number;
  /** True boundaries: start of each part, then the end of the last. */
  boundaries: number[];
  /** Where each countdown begins (beeps or count), per boundary; absent for the whistle. */
  countdownStarts: number[];
  lines: SpokenLine[];
  beeps: { atSeconds: number; seconds: number }[];
  whistles: { atSeconds: number; seconds: number }[];
  /** Music plays from the first boundary to the last. */
  music: { from: number; to: number };
  beepHz: number;
}

/** Small seeded generator (mulberry32), so a score is the same on every machine. */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const COUNT_WORDS = ['three', 'two', 'one'];
const FORM_LINES = ['keep your back straight', 'breathe out as you push', 'nice and steady', 'chest up, knees soft', 'you are doing great'];
const CHATTER_LINES = ['where did you get those shoes', 'is it the long one today', 'I need some water', 'how many rounds is it', 'my legs are done'];

/** A part of the class as the soundtrack needs it: what it is, and which exercise. */
export interface SoundtrackPart {
  kind: string;
  exercise?: string | undefined;
}

function changeWord(next: SoundtrackPart | undefined): string {
  if (!next) return 'and done';
  switch (next.kind) {
    case 'work':
      return 'go';
    case 'rest':
      return 'rest';
    case 'round-break':
      return 'break';
    case 'cooldown':
      return 'stretch';
    default:
      return 'go';
  }
}

/** Lays the plan out with drift and decides every sound. */
export function scoreSoundtrack(segments: readonly PlannedSegment[], options: SoundtrackOptions): SoundtrackScore {
  const random = seededRandom(options.seed);
  const drift = options.driftSeconds ?? 1.5;
  const longBreak = options.longBreak === undefined ? { index: 0, extraSeconds: 8 } : options.longBreak;
  const leadIn = options.leadInSeconds ?? 20;
  const boundaries: number[] = [leadIn];
  let breakIndex = 0;
  for (const seg of segments) {
    let seconds = seg.seconds + (random() * 2 - 1) * drift;
    if (seg.kind === 'round-break') {
      if (longBreak && breakIndex === longBreak.index) seconds = seg.seconds + longBreak.extraSeconds;
      breakIndex++;
    }
    boundaries.push(boundaries[boundaries.length - 1]! + Math.max(3, seconds));
  }
  const end = boundaries[boundaries.length - 1]!;
  return scoreAtBoundaries(segments, boundaries, { ...options, durationSeconds: end + (options.tailSeconds ?? 6) }, random);
}

/**
 * Decides every sound of a class whose parts start at known times: `boundaries` holds the start
 * of each part and then the end of the last (so one more than `parts`); the change signal sounds
 * at each. Demo recordings use it with the marked timeline's times; {@link scoreSoundtrack} with
 * a drifted plan.
 */
export function scoreAtBoundaries(
  parts: readonly SoundtrackPart[],
  boundaries: readonly number[],
  options: Pick<SoundtrackOptions, 'signal' | 'seed' | 'beepHz' | 'silentBoundaries' | 'talkative'> & { durationSeconds: number },
  random = seededRandom(options.seed),
): SoundtrackScore {
  if (boundaries.length !== parts.length + 1) throw new RangeError('boundaries must be one more than parts');
  const end = boundaries[boundaries.length - 1]!;
  const lines: SpokenLine[] = [];
  const beeps: SoundtrackScore['beeps'] = [];
  const whistles: SoundtrackScore['whistles'] = [];
  const countdownStarts: number[] = [];

  // The coach welcomes the class before the warm-up.
  if (boundaries[0]! >= 6) lines.push({ atSeconds: 1.5, text: 'welcome everyone, today we have a circuit, grab some water', voice: 'coach', gainDb: -4 });
  boundaries.forEach((b, j) => {
    const next = parts[j];
    if (options.silentBoundaries?.includes(j)) {
      // No signal here.
    } else if (options.signal === 'beeps') {
      for (let k = 3; k >= 1; k--) beeps.push({ atSeconds: b - k, seconds: 0.15 });
      beeps.push({ atSeconds: b, seconds: 0.6 });
      countdownStarts.push(b - 3);
    } else if (options.signal === 'whistle') {
      whistles.push({ atSeconds: b, seconds: 0.5 + random() * 0.3 });
    } else {
      // A person counts close to, not exactly on, a one-second beat.
      let at = b;
      const times: number[] = [];
      for (let k = 0; k < 3; k++) {
        at -= 0.9 + random() * 0.2;
        times.unshift(at);
      }
      times.forEach((t, k) => lines.push({ atSeconds: t, text: COUNT_WORDS[k]!, voice: 'coach', gainDb: -2 }));
      lines.push({ atSeconds: b, text: changeWord(next), voice: 'coach', gainDb: -2 });
      countdownStarts.push(times[0]!);
    }
    // Talking through the part, away from the changes.
    const partEnd = boundaries[j + 1];
    if (next && partEnd !== undefined && partEnd - b >= (options.talkative ? 6 : 12)) {
      const text = options.talkative ? talkThrough(parts, j, random) : next.kind === 'work' ? FORM_LINES[Math.floor(random() * FORM_LINES.length)]! : next.kind === 'rest' || next.kind === 'round-break' ? `next up, ${nextExercise(parts, j)}` : 'roll your shoulders, shake it out';
      lines.push({ atSeconds: b + 2.5 + random() * 2, text, voice: 'coach', gainDb: -6 });
    }
  });
  // The coach closes the class when the recording runs on after the last part.
  if (options.durationSeconds - end >= 8) lines.push({ atSeconds: end + 2.5, text: 'well done everyone, drink some water and see you next time', voice: 'coach', gainDb: -4 });
  // Chatter in the room now and then, quieter than the coach, anywhere.
  for (let t = 4 + random() * 10; t < end; t += 12 + random() * 18) {
    lines.push({ atSeconds: t, text: CHATTER_LINES[Math.floor(random() * CHATTER_LINES.length)]!, voice: 'chatter', gainDb: -20 });
  }
  lines.sort((a, b) => a.atSeconds - b.atSeconds);
  return {
    durationSeconds: options.durationSeconds,
    boundaries: [...boundaries],
    countdownStarts,
    lines,
    beeps,
    whistles,
    music: { from: boundaries[0]!, to: end },
    beepHz: options.beepHz ?? 1000,
  };
}

/** What a talkative coach says early in part `j`: the exercise and a tip, or what comes next. */
function talkThrough(parts: readonly SoundtrackPart[], j: number, random: () => number): string {
  const part = parts[j]!;
  switch (part.kind) {
    case 'work':
      return `${part.exercise ?? 'work'}, ${FORM_LINES[Math.floor(random() * FORM_LINES.length)]!}`;
    case 'warmup':
      return `easy warm up, first up is ${nextExercise(parts, j)}`;
    case 'cooldown':
      return 'cool down, breathe slowly and stretch';
    default:
      return `next up, ${nextExercise(parts, j)}`;
  }
}

function nextExercise(segments: readonly SoundtrackPart[], j: number): string {
  for (let k = j + 1; k < segments.length; k++) if (segments[k]!.kind === 'work') return segments[k]!.exercise ?? 'the next one';
  return 'the cool-down';
}

/**
 * Renders the score at `sampleRate`. `clips` maps `${voice}:${text}` to the spoken clip (mono,
 * [-1, 1], starting at its first sound). Levels: music bed about -24 dBFS RMS, beeps -8 dBFS peak,
 * whistle -10 dBFS peak, coach at its clip level plus gain; the sum is limited to [-1, 1].
 */
export function mixSoundtrack(score: SoundtrackScore, clips: ReadonlyMap<string, Float32Array>, sampleRate: number, seed = 1): Float32Array {
  const out = new Float32Array(Math.ceil(score.durationSeconds * sampleRate));
  const random = seededRandom(seed);
  addMusic(out, sampleRate, score.music.from, score.music.to, random);
  for (const line of score.lines) {
    const clip = clips.get(`${line.voice}:${line.text}`);
    if (!clip) throw new Error(`no clip for ${line.voice}:${line.text}`);
    const gain = 10 ** (line.gainDb / 20);
    const from = Math.round(line.atSeconds * sampleRate);
    for (let i = 0; i < clip.length && from + i < out.length; i++) if (from + i >= 0) out[from + i] = (out[from + i] as number) + gain * (clip[i] as number);
  }
  for (const beep of score.beeps) addTone(out, sampleRate, beep.atSeconds, beep.seconds, score.beepHz, 0.4);
  for (const w of score.whistles) addWhistle(out, sampleRate, w.atSeconds, w.seconds, random);
  for (let i = 0; i < out.length; i++) out[i] = Math.max(-1, Math.min(1, out[i] as number));
  return out;
}

function addTone(out: Float32Array, sr: number, at: number, seconds: number, hz: number, amp: number): void {
  const from = Math.round(at * sr);
  const n = Math.round(seconds * sr);
  const ramp = Math.round(0.003 * sr); // 3 ms edges, as a timer's beep has, so it does not click
  for (let i = 0; i < n && from + i < out.length; i++) {
    if (from + i < 0) continue;
    const edge = Math.min(1, i / ramp, (n - i) / ramp);
    out[from + i] = (out[from + i] as number) + amp * edge * Math.sin((2 * Math.PI * hz * i) / sr);
  }
}

/** A pea whistle: about 3 kHz, its pitch rattled ±150 Hz some 25 times a second, with breath noise. */
function addWhistle(out: Float32Array, sr: number, at: number, seconds: number, random: () => number): void {
  const from = Math.round(at * sr);
  const n = Math.round(seconds * sr);
  const base = 2900 + random() * 300;
  const trill = 22 + random() * 8;
  let phase = 0;
  for (let i = 0; i < n && from + i < out.length; i++) {
    const t = i / sr;
    const hz = base + 150 * Math.sin(2 * Math.PI * trill * t);
    phase += (2 * Math.PI * hz) / sr;
    const edge = Math.min(1, i / (0.01 * sr), (n - i) / (0.02 * sr));
    out[from + i] = (out[from + i] as number) + edge * (0.3 * Math.sin(phase) + 0.03 * (random() * 2 - 1));
  }
}

/**
 * A music bed at 124 beats per minute: a kick on every beat, a hi-hat between, a bass line and a
 * pad chord with harmonics that changes every two bars. One 32-beat loop is synthesised and
 * repeated (as loop-based music is), which keeps a long class cheap to render. Fades in and out
 * over a second.
 */
function addMusic(out: Float32Array, sr: number, from: number, to: number, random: () => number): void {
  const beat = 60 / 124;
  const chords = [
    [220, 277.18, 329.63],
    [196, 246.94, 293.66],
    [174.61, 220, 261.63],
    [196, 246.94, 329.63],
  ];
  const loop = new Float32Array(Math.round(32 * beat * sr));
  for (let i = 0; i < loop.length; i++) {
    const t = i / sr;
    const beatPos = t / beat;
    const sinceBeat = (beatPos - Math.floor(beatPos)) * beat;
    const sinceOff = (beatPos + 0.5 - Math.floor(beatPos + 0.5)) * beat;
    const chord = chords[Math.floor(beatPos / 8) % chords.length]!;
    let s = 0;
    // Kick: a falling 50–110 Hz thump.
    s += 0.5 * Math.exp(-sinceBeat * 25) * Math.sin(2 * Math.PI * (50 + 60 * Math.exp(-sinceBeat * 30)) * sinceBeat);
    // Hi-hat: a short noise tick.
    s += 0.08 * Math.exp(-sinceOff * 60) * (random() * 2 - 1);
    // Bass on the chord's root, an octave down.
    s += 0.12 * Math.sin(2 * Math.PI * (chord[0]! / 2) * t);
    // Pad: three notes with three harmonics each.
    for (const f of chord) for (let h = 1; h <= 3; h++) s += (0.03 / h) * Math.sin(2 * Math.PI * f * h * t);
    loop[i] = 0.35 * s;
  }
  const start = Math.max(0, Math.round(from * sr));
  const stop = Math.min(out.length, Math.round(to * sr));
  for (let i = start; i < stop; i++) {
    const fade = Math.min(1, (i - start) / sr, (stop - i) / sr);
    out[i] = (out[i] as number) + fade * (loop[(i - start) % loop.length] as number);
  }
}
