/**
 * Turns audio events into candidate boundary times, each with the kind of evidence, a score and,
 * where a countdown led into it, the countdown's start. Patterns, all common practice (no source):
 * - interval timers give a few short beeps about a second apart and a long beep at the change;
 * - a coach's whistle marks the change with its start;
 * - a spoken count ("three, two, one, go") is a run of short words about a second apart, and the
 *   change is the last word;
 * - music starting or stopping often marks the start or the end of a class part.
 */
import type { AudioEvent } from '../audio/audio-events';

export type EvidenceKind = 'tone' | 'whistle' | 'voice' | 'energy';

export interface BoundaryCandidate {
  atSeconds: number;
  evidence: EvidenceKind;
  /** 0–1: how much this looks like a boundary on its own. */
  score: number;
  /** Start of the beeps or the spoken count that led into it. */
  countdownStartSeconds?: number;
}

/** A beep this long or longer is the timer's change signal; shorter ones are countdown beeps. */
export const LONG_BEEP_SECONDS = 0.4;
/** Countdown beeps and counted words come about a second apart (0.6–1.5 s accepted). */
const COUNT_SPACING: readonly [number, number] = [0.6, 1.5];
/** A counted word is short. */
const MAX_WORD_SECONDS = 0.8;
/** Whistle pieces closer than this are one blow. */
const WHISTLE_MERGE_SECONDS = 0.5;

export function findBoundaryCandidates(events: readonly AudioEvent[]): BoundaryCandidate[] {
  const sorted = [...events].sort((a, b) => a.atSeconds - b.atSeconds);
  const candidates = [
    ...toneCandidates(sorted.filter((e) => e.kind === 'tone')),
    ...whistleCandidates(sorted.filter((e) => e.kind === 'whistle')),
    ...spokenCountCandidates(sorted.filter((e) => e.kind === 'speech')),
    ...sorted
      .filter((e) => e.kind === 'energy-rise' || e.kind === 'energy-fall')
      .map((e): BoundaryCandidate => ({ atSeconds: e.atSeconds, evidence: 'energy', score: 0.2 + 0.3 * e.strength })),
  ];
  return candidates.sort((a, b) => a.atSeconds - b.atSeconds);
}

function toneCandidates(tones: readonly AudioEvent[]): BoundaryCandidate[] {
  const out: BoundaryCandidate[] = [];
  // Short beeps not yet followed by a long one: [first, …, last].
  let run: AudioEvent[] = [];
  const flushShortRun = () => {
    // A count of short beeps with no long beep: the change is a beat after the last one.
    if (run.length >= 2) {
      const spacing = (run[run.length - 1]!.atSeconds - run[0]!.atSeconds) / (run.length - 1);
      out.push({ atSeconds: run[run.length - 1]!.atSeconds + spacing, evidence: 'tone', score: 0.5, countdownStartSeconds: run[0]!.atSeconds });
    } else if (run.length === 1) {
      out.push({ atSeconds: run[0]!.atSeconds, evidence: 'tone', score: 0.3 });
    }
    run = [];
  };
  for (const tone of tones) {
    const previous = run[run.length - 1];
    const gap = previous ? tone.atSeconds - previous.atSeconds : 0;
    if (previous && (gap < COUNT_SPACING[0] || gap > COUNT_SPACING[1])) flushShortRun();
    if (tone.durationSeconds >= LONG_BEEP_SECONDS) {
      const lead = run.length > 0 ? run[0]!.atSeconds : undefined;
      out.push({
        atSeconds: tone.atSeconds,
        evidence: 'tone',
        score: Math.min(1, 0.7 + 0.1 * run.length + 0.1 * tone.strength),
        ...(lead !== undefined ? { countdownStartSeconds: lead } : {}),
      });
      run = [];
    } else {
      run.push(tone);
    }
  }
  flushShortRun();
  return out;
}

function whistleCandidates(whistles: readonly AudioEvent[]): BoundaryCandidate[] {
  const out: BoundaryCandidate[] = [];
  let lastEnd = -Infinity;
  for (const w of whistles) {
    if (w.atSeconds - lastEnd > WHISTLE_MERGE_SECONDS) {
      out.push({ atSeconds: w.atSeconds, evidence: 'whistle', score: Math.min(1, 0.6 + 0.4 * w.strength) });
    }
    lastEnd = w.atSeconds + w.durationSeconds;
  }
  return out;
}

/**
 * Runs of at least three short bursts whose starts are about a second apart, evenly. The last
 * burst of a run scores highest (it is the "go"); earlier ones from the third on are kept as
 * weaker candidates, since the coach may run the next words on after the count.
 */
function spokenCountCandidates(speech: readonly AudioEvent[]): BoundaryCandidate[] {
  const out: BoundaryCandidate[] = [];
  let run: AudioEvent[] = [];
  const flush = () => {
    if (run.length >= 3) {
      const start = run[0]!.atSeconds;
      for (let i = 2; i < run.length; i++) {
        const last = i === run.length - 1;
        out.push({
          atSeconds: run[i]!.atSeconds,
          evidence: 'voice',
          score: last ? Math.min(0.8, 0.45 + 0.1 * i) : 0.3,
          countdownStartSeconds: start,
        });
      }
    }
    run = [];
  };
  for (const burst of speech) {
    if (burst.durationSeconds > MAX_WORD_SECONDS) {
      flush();
      continue;
    }
    const previous = run[run.length - 1];
    if (previous) {
      const gap = burst.atSeconds - previous.atSeconds;
      const firstGap = run.length >= 2 ? run[1]!.atSeconds - run[0]!.atSeconds : gap;
      const even = Math.abs(gap - firstGap) <= 0.35 * firstGap;
      if (gap < COUNT_SPACING[0] || gap > COUNT_SPACING[1] || !even) {
        flush();
      }
    }
    run.push(burst);
  }
  flush();
  return out;
}
