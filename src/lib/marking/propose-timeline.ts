/**
 * "Mark it for me": a whole proposed timeline from the plan and the recording's audio events.
 * Pure; the server answers it without saving, and the editor shows it as a layer to accept.
 */
import type { AudioEvent } from '../audio/audio-events';
import { expandPlan, markFieldsOf, type PlannedSegment } from '../plan/expand-plan';
import type { Plan } from '../plan/plan-schema';
import { roundToMillis } from '../time/format-time';
import type { Cue, Segment } from '../timeline/timeline-schema';
import { alignPlan, type AlignedBoundary } from './align-plan';
import { findBoundaryCandidates, type EvidenceKind } from './boundary-evidence';

export type BoundaryEvidence = EvidenceKind | 'plan';

export interface ProposedBoundary {
  atSeconds: number;
  /** 0–1; below {@link REVIEW_BELOW} the editor asks the coach to check it. */
  confidence: number;
  evidence: BoundaryEvidence;
}

/**
 * - `audio-aligned`: boundaries follow the recording's sounds where there were any;
 * - `plan-only`: nothing in the audio matched, the plan was laid out from the start.
 */
export type ProposalMethod = 'audio-aligned' | 'plan-only';

export interface TimelineProposal {
  segments: Segment[];
  cues: Cue[];
  boundaries: ProposedBoundary[];
  method: ProposalMethod;
}

/** Boundaries under this confidence are highlighted for review. */
export const REVIEW_BELOW = 0.6;

/**
 * Base confidence per kind of evidence: a timer's long beep is unmistakable, a whistle nearly so,
 * a count without words recognised less so, a level change is a hint. House values, no source.
 */
const BASE_CONFIDENCE: Record<BoundaryEvidence, number> = { tone: 0.97, whistle: 0.92, voice: 0.8, energy: 0.5, plan: 0.2 };

export function proposeTimeline(plan: Plan, events: readonly AudioEvent[], mediaSeconds: number): TimelineProposal {
  const schedule = expandPlan(plan, 0);
  const candidates = findBoundaryCandidates(events);
  const alignment = alignPlan(schedule.segments, candidates, mediaSeconds);
  const times = alignment.boundaries.map((b) => roundToMillis(Math.min(mediaSeconds, Math.max(0, b.atSeconds))));

  const segments: Segment[] = schedule.segments.map((p, j) => segmentFrom(p, j, times[j]!, times[j + 1]!));
  const boundaries = alignment.boundaries.map((b, j) => ({
    atSeconds: times[j]!,
    confidence: confidenceOf(b),
    evidence: b.candidate ? b.candidate.evidence : ('plan' as const),
  }));
  const cues: Cue[] = [];
  alignment.boundaries.forEach((b, j) => {
    const start = b.candidate?.countdownStartSeconds;
    if (start === undefined) return;
    const into = schedule.segments[j];
    const text = into ? `Countdown into ${describe(into)}` : 'Countdown to the end';
    cues.push({ id: `mc${cues.length + 1}`, atSeconds: roundToMillis(Math.max(0, start)), kind: 'countdown', text });
  });
  const method: ProposalMethod = alignment.boundaries.some((b) => b.candidate) ? 'audio-aligned' : 'plan-only';
  return { segments, cues, boundaries, method };
}

function confidenceOf(b: AlignedBoundary): number {
  if (!b.candidate) return BASE_CONFIDENCE.plan;
  let c = BASE_CONFIDENCE[b.candidate.evidence] * (0.7 + 0.3 * b.candidate.score);
  // Far from where the plan expected it, for that kind of part: more likely a stray sound.
  c *= Math.exp(-(b.driftZ ** 2) / 8);
  if (b.ambiguous) c *= 0.6;
  return Math.round(c * 100) / 100;
}

function segmentFrom(p: PlannedSegment, j: number, start: number, end: number): Segment {
  return {
    id: `m${j + 1}`,
    kind: p.kind,
    startSeconds: start,
    // The aligner keeps each boundary at least half a second after the one before.
    endSeconds: Math.max(end, roundToMillis(start + 0.001)),
    ...markFieldsOf(p),
  };
}

function describe(p: PlannedSegment): string {
  switch (p.kind) {
    case 'work':
      return p.exercise ?? 'work';
    case 'rest':
      return 'rest';
    case 'round-break':
      return 'the round break';
    case 'warmup':
      return 'the warm-up';
    case 'cooldown':
      return 'the cool-down';
    case 'talk':
      return 'the talk';
  }
}
