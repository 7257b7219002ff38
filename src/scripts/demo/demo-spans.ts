import { KIND_COLOURS } from '~/lib/editor/segment-style';
import type { Segment } from '~/lib/timeline/timeline-schema';
import { scoreAtBoundaries, type ChangeSignal, type SoundtrackScore } from '~/lib/media/class-soundtrack';
import { placeDemoSpans, type DemoSpan } from './demo-video-args';

const KIND_LABELS: Record<Segment['kind'], string> = {
  work: 'WORK',
  rest: 'REST',
  warmup: 'WARM-UP',
  cooldown: 'COOL-DOWN',
  'round-break': 'ROUND BREAK',
  talk: 'TALK',
  intro: 'WELCOME',
  outro: 'WELL DONE',
};

/** The on-screen text for a segment, e.g. `WORK  Goblet squat  round 2/4`. */
export function demoLabel(s: Segment, rounds: number): string {
  const parts = [KIND_LABELS[s.kind]];
  if (s.kind === 'work' && s.exercise) parts.push(s.exercise);
  if (s.round && rounds > 1) parts.push(`round ${s.round}/${rounds}`);
  if (s.set) parts.push(`set ${s.set}`);
  return parts.join('  ');
}

/**
 * Spans of a demo recording that plays a marked timeline as it was taught: each segment runs
 * until the next one starts, so an overlap is cut short and unmarked time belongs to what came before.
 */
export function demoSpans(segments: readonly Segment[], mediaSeconds: number): DemoSpan[] {
  const sorted = [...segments].sort((a, b) => a.startSeconds - b.startSeconds || a.endSeconds - b.endSeconds);
  const rounds = Math.max(0, ...sorted.map((s) => s.round ?? 0));
  const spans: DemoSpan[] = [];
  const first = sorted[0];
  if (first && first.startSeconds > 0) spans.push({ label: 'GET READY', seconds: first.startSeconds, color: KIND_COLOURS.talk });
  sorted.forEach((s, i) => {
    const end = Math.min(sorted[i + 1]?.startSeconds ?? Math.max(s.endSeconds, mediaSeconds), mediaSeconds);
    const seconds = end - s.startSeconds;
    if (seconds > 0.05) spans.push({ label: demoLabel(s, rounds), seconds, color: KIND_COLOURS[s.kind], part: { kind: s.kind, exercise: s.exercise } });
  });
  return spans;
}

/** Frame rate of the demo recordings (their spans and sounds sit on its frame grid). */
export const DEMO_FPS = 30;

/** Parts the coach signals the change into: everything the plan lays out (not the welcome and goodbye). */
const SIGNALLED = new Set<string>(['warmup', 'work', 'rest', 'round-break', 'cooldown', 'talk']);

/**
 * The soundtrack of a demo recording: the change signal at the start of every planned part (on
 * the recording's frame grid) and at the end of the last, the coach talking through the parts
 * and naming the next exercise, music from the first change to the last, chatter throughout.
 * Invented demo content; the seed comes from the spans, so a class sounds the same every time.
 */
export function demoSoundtrackScore(spans: readonly DemoSpan[], fps: number, signal: ChangeSignal): SoundtrackScore {
  const placed = placeDemoSpans(spans, fps);
  const planned = placed.flatMap((p, i) => {
    const part = spans[i]!.part;
    return part && SIGNALLED.has(part.kind) ? [{ part, start: p.startSeconds, end: p.endSeconds }] : [];
  });
  const durationSeconds = placed.at(-1)!.endSeconds;
  const boundaries = planned.length ? [...planned.map((p) => p.start), planned.at(-1)!.end] : [0];
  const seed = spans.reduce((h, s) => (h * 31 + Math.round(s.seconds * 10)) >>> 0, 7);
  return scoreAtBoundaries(planned.map((p) => p.part), boundaries, { signal, seed, durationSeconds, talkative: true });
}
