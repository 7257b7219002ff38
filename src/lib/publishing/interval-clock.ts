import type { Segment } from '../timeline/timeline-schema';
import { circuitRounds, emomMinutesById, formatHeading, partLabel, PART_NAMES } from './member-words';

/** What the interval clock shows at one moment of the class. */
export interface ClockState {
  /** The part now on, or null between marked parts. */
  current: { kind: Segment['kind']; label: string; exercise?: string; side?: Segment['side'] } | null;
  /** The format's words while an AMRAP or EMOM is on: "AMRAP 12:00", "EMOM minute 3 of 10". */
  format: string | null;
  /** Seconds left in the current part, and its length (for the ring). */
  remaining: number;
  length: number;
  round: number | null;
  rounds: number | null;
  set: number | null;
  sets: number | null;
  /** The next part, e.g. "Push-up" or "Rest", with seconds until it starts. */
  next: { label: string; inSeconds: number } | null;
}


const label = partLabel;

/** Index of the last segment starting at or before `t` (binary search; segments sorted by start). */
function indexAt(sorted: readonly Segment[], t: number): number {
  let lo = 0;
  let hi = sorted.length - 1;
  let found = -1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    if (sorted[mid]!.startSeconds <= t) {
      found = mid;
      lo = mid + 1;
    } else hi = mid - 1;
  }
  return found;
}

/** Prepares a timeline for the clock: sorted, with round and set totals. */
export function clockTimeline(segments: readonly Segment[]) {
  const sorted = [...segments].sort((a, b) => a.startSeconds - b.startSeconds);
  const rounds = circuitRounds(sorted) || null;
  const sets = new Map<string, number>();
  for (const s of sorted) if (s.set && s.exercise) sets.set(s.exercise, Math.max(sets.get(s.exercise) ?? 0, s.set));
  return { sorted, rounds, sets, emomMinutes: emomMinutesById(sorted) };
}

/** The clock at time `t` (seconds into the recording). */
export function clockAt(timeline: ReturnType<typeof clockTimeline>, t: number): ClockState {
  const { sorted, rounds, sets, emomMinutes } = timeline;
  const i = indexAt(sorted, t);
  const seg = i >= 0 && t < sorted[i]!.endSeconds ? sorted[i]! : null;
  const nextSeg = sorted[i + 1] ?? null;
  // A rest belongs to the round of the move before it, even when the rest itself is unmarked.
  // EMOM minutes are not circuit rounds: the format line says the minute.
  const roundSource = seg?.format === 'emom' ? undefined : seg?.round ? seg : [...sorted.slice(0, i + 1)].reverse().find((s) => s.round && s.format !== 'emom');
  const setTotal = seg?.exercise ? sets.get(seg.exercise) ?? null : null;
  return {
    current: seg ? { kind: seg.kind, label: label(seg), ...(seg.exercise ? { exercise: seg.exercise } : {}), ...(seg.side ? { side: seg.side } : {}) } : null,
    format: seg ? formatHeading(seg, emomMinutes.get(seg.id)) : null,
    remaining: seg ? Math.max(0, seg.endSeconds - t) : nextSeg ? Math.max(0, nextSeg.startSeconds - t) : 0,
    length: seg ? seg.endSeconds - seg.startSeconds : 0,
    round: rounds && roundSource?.round ? roundSource.round : null,
    rounds,
    set: seg?.set ?? null,
    sets: setTotal,
    next: nextSeg ? { label: label(nextSeg), inSeconds: Math.max(0, nextSeg.startSeconds - t) } : null,
  };
}

/**
 * The small line above the part's name on the clock: "Work" over an exercise's name, "Get ready"
 * before the first part, the format's words in an AMRAP or EMOM ("EMOM minute 3 of 10"), and
 * nothing where it would only repeat the name ("Welcome", "Rest").
 */
export function clockHeading(clock: Pick<ClockState, 'current' | 'format'>): string | null {
  if (!clock.current) return 'Get ready';
  if (clock.format) return clock.format;
  const kindName = PART_NAMES[clock.current.kind];
  return kindName.toLowerCase() === clock.current.label.toLowerCase() ? null : kindName;
}
