import type { Segment } from '../timeline/timeline-schema';
import { formatVttTimestamp } from '../time/format-time';
import { circuitRounds, emomMinutesById, formatHeading, partLabel } from './member-words';

/** One chapter members can jump to: a part of the class and the rest that follows it. */
export interface Chapter {
  index: number;
  title: string;
  kind: Segment['kind'];
  startSeconds: number;
  endSeconds: number;
  exercise?: string;
  round?: number;
  rounds?: number;
  set?: number;
  sets?: number;
  /** A station done per side: which side this chapter is. */
  side?: Segment['side'];
  /** amrap or emom: the chapter is that format's span or minute (`round` is the EMOM minute). */
  format?: Segment['format'];
  /** An AMRAP's span: the exercises members repeat, from the plan's AMRAP block. */
  exercises?: string[];
}


/**
 * Chapters from a checked timeline: every part except rests starts a chapter, and a rest
 * belongs to the chapter before it (members jump to moves, not to rests). Chapters are
 * back-to-back and never overlap, as WebVTT chapter cues must not (W3C WebVTT §4.5.1).
 * `amrapExercises` (segment id -> exercises, from `amrapExercisesBySegment`) gives an AMRAP's
 * chapter the list members repeat.
 */
export function buildChapters(segments: readonly Segment[], amrapExercises: ReadonlyMap<string, readonly string[]> = new Map()): Chapter[] {
  const sorted = [...segments].sort((a, b) => a.startSeconds - b.startSeconds);
  const rounds = circuitRounds(sorted);
  const emomMinutes = emomMinutesById(sorted);
  const setsByExercise = new Map<string, number>();
  for (const s of sorted) if (s.set && s.exercise) setsByExercise.set(s.exercise, Math.max(setsByExercise.get(s.exercise) ?? 0, s.set));
  const chapters: Chapter[] = [];
  for (const s of sorted) {
    const last = chapters[chapters.length - 1];
    if (s.kind === 'rest' && last) {
      last.endSeconds = Math.max(last.endSeconds, s.endSeconds);
      continue;
    }
    if (last && last.endSeconds > s.startSeconds) last.endSeconds = s.startSeconds;
    const sets = s.exercise ? setsByExercise.get(s.exercise) : undefined;
    const chapter: Chapter = {
      index: chapters.length,
      title: chapterTitle(s, rounds, sets, emomMinutes.get(s.id)),
      kind: s.kind,
      startSeconds: s.startSeconds,
      endSeconds: s.endSeconds,
      ...(s.exercise ? { exercise: s.exercise } : {}),
      ...(s.round ? { round: s.round, rounds: s.format === 'emom' ? emomMinutes.get(s.id) ?? s.round : rounds } : {}),
      ...(s.set ? { set: s.set, ...(sets ? { sets } : {}) } : {}),
      ...(s.side ? { side: s.side } : {}),
      ...(s.format ? { format: s.format } : {}),
      ...(amrapExercises.has(s.id) ? { exercises: [...amrapExercises.get(s.id)!] } : {}),
    };
    chapters.push(chapter);
  }
  // Close small gaps so the chapter list covers the class without holes.
  for (let i = 0; i < chapters.length - 1; i++) chapters[i]!.endSeconds = chapters[i + 1]!.startSeconds;
  return chapters.filter((c) => c.endSeconds > c.startSeconds).map((c, index) => ({ ...c, index }));
}

/**
 * "Goblet squat · round 2 of 4", "Side lunge — left · round 1 of 3", "Fast feet · set 3 of 8",
 * "AMRAP 12:00 — round as many as you can", "EMOM minute 3 of 10 — Burpee", "Warm-up".
 */
export function chapterTitle(s: Segment, rounds: number, sets?: number, emomMinutes?: number): string {
  if (s.title && s.kind !== 'work') return s.title;
  const heading = formatHeading(s, emomMinutes);
  const name = partLabel(s);
  if (heading) return `${heading} — ${s.kind === 'work' && s.format === 'amrap' ? name.toLowerCase() : name}`;
  const parts = [name];
  if (s.round && rounds > 1) parts.push(`round ${s.round} of ${rounds}`);
  if (s.set) parts.push(sets ? `set ${s.set} of ${sets}` : `set ${s.set}`);
  return parts.join(' · ');
}

/**
 * The chapters as a WebVTT file (W3C WebVTT): the WEBVTT header, a blank line, then one cue per
 * chapter with a numeric identifier and the title as plain text (§4.2.3: chapter text has no tags).
 */
export function chaptersToVtt(chapters: readonly Chapter[]): string {
  const blocks = chapters.map(
    (c) => `${c.index + 1}\n${formatVttTimestamp(c.startSeconds)} --> ${formatVttTimestamp(c.endSeconds)}\n${plainText(c.title)}`,
  );
  return `WEBVTT\n\n${blocks.join('\n\n')}\n`;
}

/** Cue text must not contain "-->", line breaks or markup characters. */
function plainText(title: string): string {
  return title.replace(/-->/g, '→').replace(/[\r\n]+/g, ' ').replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}
