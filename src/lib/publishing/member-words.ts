import type { Segment } from '../timeline/timeline-schema';
import { formatClock } from '../time/format-time';

/** How members read each part of a class (chapter titles, the interval clock). */
export const PART_NAMES: Record<Segment['kind'], string> = {
  intro: 'Welcome',
  warmup: 'Warm-up',
  work: 'Work',
  rest: 'Rest',
  'round-break': 'Round break',
  cooldown: 'Cool-down',
  outro: 'Wrap-up',
  talk: 'Coach talk',
};

/** The general caution shown on every class page and before a member's first play (design brief, Safety). */
export const GENERAL_CAUTION = [
  'Check with a physician before starting a new exercise programme, especially if you are pregnant, injured or have a health condition.',
  'Stop if you feel pain, dizziness or shortness of breath.',
  'When unsure, choose the easier option the coach shows.',
] as const;
export const CAUTION_FOOTNOTE = 'General information, not medical advice. Local rules and qualified professionals come first.';

/**
 * How many minutes each EMOM mark's block has: the highest minute in its run of EMOM marks (a
 * run ends at a mark of another format or when the minutes start again at 1). `sorted` is in
 * time order. Marks carry their minute as `round`.
 */
export function emomMinutesById(sorted: readonly Segment[]): Map<string, number> {
  const out = new Map<string, number>();
  let run: Segment[] = [];
  const close = () => {
    const minutes = Math.max(0, ...run.map((s) => s.round ?? 0));
    for (const s of run) out.set(s.id, minutes);
    run = [];
  };
  for (const s of sorted) {
    if (s.format !== 'emom') {
      close();
      continue;
    }
    const last = run[run.length - 1];
    if (last && s.round !== undefined && last.round !== undefined && s.round < last.round) close();
    run.push(s);
  }
  close();
  return out;
}

/** The highest circuit round of a class, leaving out EMOM minutes (they are counted per EMOM). */
export function circuitRounds(sorted: readonly Segment[]): number {
  return Math.max(0, ...sorted.map((s) => (s.format === 'emom' ? 0 : s.round ?? 0)));
}

/**
 * The name of the part itself: "Side lunge — left" for a side, the exercise of work, "Round as
 * many as you can" inside an AMRAP, else the part's kind ("Rest").
 */
export function partLabel(s: Pick<Segment, 'kind' | 'exercise' | 'side' | 'format'>): string {
  if (s.kind === 'work' && s.format === 'amrap') return 'Round as many as you can';
  if (s.kind === 'work' && s.exercise) return s.side ? `${s.exercise} — ${s.side}` : s.exercise;
  if (s.kind === 'work' && s.side) return `${PART_NAMES.work} — ${s.side}`;
  return PART_NAMES[s.kind];
}

/**
 * The format's own words above the part: "AMRAP 12:00" (the span's length) and "EMOM minute 3
 * of 10"; null for other parts. `emomMinutes` is the minutes of the mark's EMOM.
 */
export function formatHeading(s: Pick<Segment, 'format' | 'round' | 'startSeconds' | 'endSeconds'>, emomMinutes: number | undefined): string | null {
  if (s.format === 'amrap') return `AMRAP ${formatClock(Math.round(s.endSeconds - s.startSeconds))}`;
  if (s.format === 'emom' && s.round !== undefined) return `EMOM minute ${s.round}${emomMinutes ? ` of ${emomMinutes}` : ''}`;
  return null;
}
