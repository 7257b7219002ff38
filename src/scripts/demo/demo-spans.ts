import { KIND_COLOURS } from '~/lib/editor/segment-style';
import type { Segment } from '~/lib/timeline/timeline-schema';
import type { DemoSpan } from './demo-video-args';

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
    if (seconds > 0.05) spans.push({ label: demoLabel(s, rounds), seconds, color: KIND_COLOURS[s.kind] });
  });
  return spans;
}
