/**
 * What differs between two versions of a timeline, in words, for the "someone else saved"
 * choice: the editor lists each difference so the coach can keep theirs or take the other.
 */
import type { Cue, Segment, Timeline } from '../timeline/timeline-schema';
import { formatEditorTime } from '../time/format-time';
import { SEGMENT_KIND_LABELS, CUE_KIND_LABELS } from './segment-style';

export interface TimelineDifference {
  kind: 'segment' | 'cue';
  id: string;
  change: 'only-mine' | 'only-theirs' | 'changed';
  /** Plain words, e.g. `Work "Reverse lunge" 10:55.0–11:35.0`. */
  mine: string | null;
  theirs: string | null;
}

export function describeSegment(s: Segment): string {
  const parts = [SEGMENT_KIND_LABELS[s.kind]];
  if (s.exercise) parts.push(`"${s.exercise}"`);
  if (s.round) parts.push(`round ${s.round}`);
  if (s.set) parts.push(`set ${s.set}`);
  if (s.side) parts.push(`${s.side} side`);
  if (s.format) parts.push(s.format.toUpperCase());
  return `${parts.join(' ')} ${formatEditorTime(s.startSeconds)}–${formatEditorTime(s.endSeconds)}`;
}

export function describeCue(c: Cue): string {
  return `${CUE_KIND_LABELS[c.kind]} cue at ${formatEditorTime(c.atSeconds)}: "${c.text}"`;
}

/** Differences between my timeline and theirs, by id, in time order. */
export function diffTimelines(mine: Timeline, theirs: Timeline): TimelineDifference[] {
  const out: (TimelineDifference & { at: number })[] = [];
  const compare = <T extends { id: string }>(kind: 'segment' | 'cue', a: readonly T[], b: readonly T[], describe: (x: T) => string, at: (x: T) => number, key: (x: T) => string) => {
    const theirsById = new Map(b.map((x) => [x.id, x]));
    const mineIds = new Set(a.map((x) => x.id));
    for (const x of a) {
      const y = theirsById.get(x.id);
      if (!y) out.push({ kind, id: x.id, change: 'only-mine', mine: describe(x), theirs: null, at: at(x) });
      else if (key(x) !== key(y)) {
        out.push({ kind, id: x.id, change: 'changed', mine: describe(x), theirs: describe(y), at: Math.min(at(x), at(y)) });
      }
    }
    for (const y of b) if (!mineIds.has(y.id)) out.push({ kind, id: y.id, change: 'only-theirs', mine: null, theirs: describe(y), at: at(y) });
  };
  compare('segment', mine.segments, theirs.segments, describeSegment, (s) => s.startSeconds, (s) =>
    JSON.stringify([s.kind, s.startSeconds, s.endSeconds, s.exercise ?? null, s.round ?? null, s.set ?? null, s.title ?? null, s.side ?? null, s.format ?? null]));
  compare('cue', mine.cues, theirs.cues, describeCue, (c) => c.atSeconds, (c) => JSON.stringify([c.kind, c.atSeconds, c.text]));
  return out.sort((a, b) => a.at - b.at).map(({ at: _at, ...rest }) => rest);
}
