import type { Segment } from '../timeline/timeline-schema';

/**
 * A class counts as finished when the member has watched at least 90 % of its work intervals
 * (our house rule: warm-up, rests and talk can be skipped, the work cannot). Watched spans are
 * [from, to] pairs in seconds; overlapping spans count once.
 */
export const FINISH_SHARE_OF_WORK = 0.9;

/** Merges overlapping [from, to] spans. */
export function mergeSpans(spans: readonly (readonly [number, number])[]): [number, number][] {
  const sorted = spans.filter(([a, b]) => b > a).map(([a, b]) => [a, b] as [number, number]).sort((x, y) => x[0] - y[0]);
  const out: [number, number][] = [];
  for (const [a, b] of sorted) {
    const last = out[out.length - 1];
    if (last && a <= last[1]) last[1] = Math.max(last[1], b);
    else out.push([a, b]);
  }
  return out;
}

/** Seconds of work intervals covered by the watched spans. */
export function workWatchedSeconds(segments: readonly Segment[], watched: readonly (readonly [number, number])[]): number {
  const spans = mergeSpans(watched);
  let total = 0;
  for (const s of segments) {
    if (s.kind !== 'work') continue;
    for (const [a, b] of spans) total += Math.max(0, Math.min(b, s.endSeconds) - Math.max(a, s.startSeconds));
  }
  return total;
}

/** Total seconds of work intervals. */
export const workSeconds = (segments: readonly Segment[]) =>
  segments.filter((s) => s.kind === 'work').reduce((sum, s) => sum + (s.endSeconds - s.startSeconds), 0);

/** Whether the watched spans finish the class by the rule above. */
export function isFinished(segments: readonly Segment[], watched: readonly (readonly [number, number])[]): boolean {
  const work = workSeconds(segments);
  return work > 0 && workWatchedSeconds(segments, watched) >= FINISH_SHARE_OF_WORK * work - 1e-6;
}
