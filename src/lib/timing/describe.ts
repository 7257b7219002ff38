/** Plain-language names for segments and planned intervals, used in finding messages. */
import type { PlannedSegment } from '../plan/expand-plan';
import type { Segment, SegmentKind } from '../timeline/timeline-schema';
import { formatEditorTime, formatLength } from '../time/format-time';

const KIND_NAMES: Record<SegmentKind, string> = {
  intro: 'intro',
  warmup: 'warm-up',
  work: 'work',
  rest: 'rest',
  'round-break': 'round break',
  cooldown: 'cool-down',
  outro: 'outro',
  talk: 'talk',
};

export function kindName(kind: SegmentKind): string {
  return KIND_NAMES[kind];
}

/** "round 2, station 3" / "set 5" / "minute 3" for a planned interval ("block 2" for single blocks). */
export function plannedPlace(p: PlannedSegment): string {
  if (p.blockKind === 'emom' && p.round !== undefined) return `EMOM minute ${p.round}, block ${p.blockIndex + 1}`;
  if (p.round !== undefined && p.stationIndex !== undefined && p.kind !== 'round-break') {
    return `round ${p.round}, station ${p.stationIndex + 1}`;
  }
  if (p.kind === 'round-break' && p.round !== undefined) return `after round ${p.round}`;
  if (p.set !== undefined) return `set ${p.set}`;
  return `block ${p.blockIndex + 1}`;
}

/**
 * e.g. `Goblet squat (round 2, station 3)`, `Side lunge, left side (round 1, station 2)`,
 * `the switch pause of Side lunge (round 1, station 2)`, `the AMRAP of 12:00 (block 2)`.
 */
export function plannedName(p: PlannedSegment): string {
  if (p.format === 'amrap') return `the AMRAP of ${formatLength(p.seconds)} (${plannedPlace(p)})`;
  const what = p.exercise ?? KIND_NAMES[p.kind];
  if (p.side === 'left' && p.kind === 'rest') return `the switch pause of ${what} (${plannedPlace(p)})`;
  return `${what}${p.side && p.kind === 'work' ? `, ${p.side} side` : ''} (${plannedPlace(p)})`;
}

/** e.g. `the work "Goblet squat" at 3:40.0`, `the work "Side lunge" (left side) at 3:40.0`. */
export function segmentName(s: Segment): string {
  const label = s.exercise ?? s.title ?? (s.format === 'amrap' ? 'AMRAP' : undefined);
  const side = s.side ? ` (${s.side} side)` : '';
  return `the ${KIND_NAMES[s.kind]}${label ? ` "${label}"` : ''}${side} at ${formatEditorTime(s.startSeconds)}`;
}

/** Capitalises the first letter of a sentence. */
export function sentence(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

export { formatEditorTime as at, formatLength as length };
