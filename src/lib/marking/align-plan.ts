/**
 * Aligns the plan's boundaries to candidate times by dynamic programming, in two steps:
 * 1. a global offset: where the plan, shifted as a whole, meets the most evidence (this absorbs a
 *    talk before the warm-up or a late start);
 * 2. a Viterbi pass over the boundaries in plan order: each boundary takes a candidate near where
 *    the plan puts it, or — with no evidence — the time the plan gives after the previous one.
 *    Each segment may run long or short by a few seconds (more for round breaks and free-flowing
 *    blocks), so the coach's real drift is followed, and the order of the plan is never changed.
 */
import type { PlannedKind, PlannedSegment } from '../plan/expand-plan';
import type { BoundaryCandidate, EvidenceKind } from './boundary-evidence';

export interface AlignedBoundary {
  atSeconds: number;
  /** The candidate used, or null when the plan placed the boundary. */
  candidate: BoundaryCandidate | null;
  /** Seconds the segment before this boundary differs from its planned length (0 for the first). */
  deviationSeconds: number;
  /** That difference in units of the part's usual drift (0 = as planned, 1 = a usual deviation). */
  driftZ: number;
  /** True when another candidate nearby explained the audio almost as well. */
  ambiguous: boolean;
}

export interface Alignment {
  offsetSeconds: number;
  boundaries: AlignedBoundary[];
}

/**
 * How far a segment of each kind may plausibly run from its planned length: `sigma` shapes the
 * cost (a normal deviation), `short`/`long` are hard limits. Common practice, no source: live
 * intervals are rarely more than a few seconds off, round breaks run long while the coach talks,
 * warm-ups and talks are free-flowing.
 */
interface Drift {
  sigma: number;
  sigmaLong: number;
  short: number;
  long: number;
}
function driftFor(kind: PlannedKind, planned: number): Drift {
  switch (kind) {
    case 'work':
    case 'rest':
      return { sigma: 1.5, sigmaLong: 1.5, short: Math.max(4, 0.3 * planned), long: Math.max(6, 0.5 * planned) };
    case 'round-break':
      return { sigma: 2.5, sigmaLong: 8, short: Math.max(5, 0.4 * planned), long: Math.max(30, planned) };
    default:
      return { sigma: 15, sigmaLong: 20, short: Math.max(20, 0.5 * planned), long: Math.max(60, planned) };
  }
}

/** Weight of a candidate's score against the drift cost (in units of squared sigmas / 2). */
const EVIDENCE_WEIGHT = 4;
/** Kernel width for the offset search, seconds. */
const OFFSET_SIGMA = 1;
const OFFSET_STEP = 0.1;
/** Candidates considered for a boundary lie this far around the offset plan, plus 5 % of the time into the plan. */
const WINDOW_SECONDS = 25;
/** States kept per boundary after pruning (by score). */
const MAX_PLAN_STATES = 24;

interface State {
  at: number;
  /** Best score of a path from the first boundary to this state (its own evidence included). */
  score: number;
  /** Best score of the rest of the path after this state (filled by the backward pass). */
  rest: number;
  from: number; // index into the previous boundary's states, -1 for the first
  candidate: BoundaryCandidate | null;
  deviation: number;
  z: number;
}

/** Score of moving from `p` to the evidence state at `at`, or null when the drift is implausible. */
function stepScore(p: State, at: number, planned: number, drift: Drift, evidence: number): { score: number; deviation: number; z: number } | null {
  const deviation = at - p.at - planned;
  if (deviation < -drift.short || deviation > drift.long || at - p.at < 0.5) return null;
  const z = deviation / (deviation > 0 ? drift.sigmaLong : drift.sigma);
  return { score: EVIDENCE_WEIGHT * evidence - (z * z) / 2, deviation, z };
}

/** Boundary times of a schedule: start of each segment, then the end of the last. */
export function plannedBoundaries(segments: readonly PlannedSegment[]): number[] {
  if (segments.length === 0) return [];
  const last = segments[segments.length - 1]!;
  return [...segments.map((s) => s.startSeconds), last.startSeconds + last.seconds];
}

export function alignPlan(segments: readonly PlannedSegment[], candidates: readonly BoundaryCandidate[], mediaSeconds: number): Alignment {
  const planned = plannedBoundaries(segments);
  if (planned.length === 0) return { offsetSeconds: 0, boundaries: [] };
  const sorted = [...candidates].sort((a, b) => a.atSeconds - b.atSeconds);
  const offset = bestOffset(planned, sorted, mediaSeconds);

  const layers: State[][] = [];
  // First boundary: any candidate near the offset plan, or the offset plan itself.
  const first: State[] = [{ at: Math.max(0, planned[0]! + offset), score: 0, rest: 0, from: -1, candidate: null, deviation: 0, z: 0 }];
  for (const c of inWindow(sorted, planned[0]! + offset, WINDOW_SECONDS)) {
    const d = (c.atSeconds - planned[0]! - offset) / 5;
    first.push({ at: c.atSeconds, score: EVIDENCE_WEIGHT * c.score - (d * d) / 2, rest: 0, from: -1, candidate: c, deviation: 0, z: 0 });
  }
  layers.push(first);

  for (let j = 1; j < planned.length; j++) {
    const seg = segments[j - 1]!;
    const drift = driftFor(seg.kind, seg.seconds);
    const previous = layers[j - 1]!;
    const next: State[] = [];
    // Plan-placed states: each previous state carried on by the planned length.
    previous.forEach((p, index) => {
      next.push({ at: p.at + seg.seconds, score: p.score, rest: 0, from: index, candidate: null, deviation: 0, z: 0 });
    });
    // Evidence states: best previous state for each candidate in the window.
    const centre = planned[j]! + offset;
    const reach = WINDOW_SECONDS + 0.05 * planned[j]!;
    for (const c of inWindow(sorted, centre, reach)) {
      let best: State | null = null;
      for (let i = 0; i < previous.length; i++) {
        const p = previous[i]!;
        const step = stepScore(p, c.atSeconds, seg.seconds, drift, c.score);
        if (!step) continue;
        const score = p.score + step.score;
        if (!best || score > best.score) best = { at: c.atSeconds, score, rest: 0, from: i, candidate: c, deviation: step.deviation, z: step.z };
      }
      if (best) next.push(best);
    }
    layers.push(prune(next));
  }

  backward(layers, segments);

  // Trace back from the best final state.
  const last = layers[layers.length - 1]!;
  let index = 0;
  for (let i = 1; i < last.length; i++) if (last[i]!.score > last[index]!.score) index = i;
  const chosen: State[] = [];
  for (let j = layers.length - 1; j >= 0; j--) {
    const s = layers[j]![index]!;
    chosen.push(s);
    index = s.from;
  }
  chosen.reverse();
  return {
    offsetSeconds: offset,
    boundaries: chosen.map((s, j) => ({
      atSeconds: s.at,
      candidate: s.candidate,
      deviationSeconds: s.candidate ? s.deviation : 0,
      driftZ: s.candidate ? s.z : 0,
      ambiguous: s.candidate ? isAmbiguous(layers[j]!, s) : false,
    })),
  };
}

/**
 * Keeps every evidence state and the best plan-placed ones; states at the same time (within
 * 50 ms) are merged into the best, so plan-placed chains cannot multiply.
 */
function prune(states: State[]): State[] {
  states.sort((a, b) => b.score - a.score);
  const kept: State[] = [];
  let planStates = 0;
  for (const s of states) {
    if (kept.some((k) => Math.abs(k.at - s.at) < 0.05)) continue;
    if (!s.candidate) {
      if (planStates >= MAX_PLAN_STATES) continue;
      planStates++;
    }
    kept.push(s);
  }
  return kept;
}

/**
 * Fills `rest` of every state: the best score of the path after it (the same moves as forward,
 * taken backwards), so a state's whole best path scores `score + rest`.
 */
function backward(layers: State[][], segments: readonly PlannedSegment[]): void {
  for (let j = layers.length - 2; j >= 0; j--) {
    const seg = segments[j]!;
    const drift = driftFor(seg.kind, seg.seconds);
    const next = layers[j + 1]!;
    layers[j]!.forEach((s, index) => {
      let best = -Infinity;
      for (const n of next) {
        if (!n.candidate) {
          if (n.from === index) best = Math.max(best, n.rest);
          continue;
        }
        const step = stepScore(s, n.at, seg.seconds, drift, n.candidate.score);
        if (step) best = Math.max(best, step.score + n.rest);
      }
      s.rest = best === -Infinity ? -1e9 : best;
    });
  }
}

/** Another candidate at a different time whose best whole path scores almost as well. */
function isAmbiguous(layer: readonly State[], chosen: State): boolean {
  const total = chosen.score + chosen.rest;
  return layer.some((s) => s !== chosen && s.candidate && Math.abs(s.at - chosen.at) > 0.3 && s.score + s.rest > total - 1);
}

function inWindow(sorted: readonly BoundaryCandidate[], centre: number, reach: number): BoundaryCandidate[] {
  const lo = lowerBound(sorted, centre - reach);
  const out: BoundaryCandidate[] = [];
  for (let i = lo; i < sorted.length && sorted[i]!.atSeconds <= centre + reach; i++) out.push(sorted[i]!);
  return out;
}

function lowerBound(sorted: readonly BoundaryCandidate[], t: number): number {
  let lo = 0;
  let hi = sorted.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (sorted[mid]!.atSeconds < t) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * The shift of the whole plan that meets the most evidence: each planned boundary counts the best
 * candidate within 3 kernel widths, weighted by a Gaussian of the distance. Ties keep the smallest
 * shift, so a recording without evidence is laid out from its start.
 */
function bestOffset(planned: readonly number[], sorted: readonly BoundaryCandidate[], mediaSeconds: number): number {
  if (sorted.length === 0) return 0;
  const span = planned[planned.length - 1]! - planned[0]!;
  const lo = -planned[0]!;
  const hi = Math.max(lo, mediaSeconds - planned[0]! - span * 0.8);
  let best = 0;
  let bestScore = 0;
  const reach = 3 * OFFSET_SIGMA;
  for (let o = lo; o <= hi + 1e-9; o += OFFSET_STEP) {
    let score = 0;
    for (const p of planned) {
      const t = p + o;
      let top = 0;
      for (let i = lowerBound(sorted, t - reach); i < sorted.length && sorted[i]!.atSeconds <= t + reach; i++) {
        const d = (sorted[i]!.atSeconds - t) / OFFSET_SIGMA;
        top = Math.max(top, sorted[i]!.score * Math.exp((-d * d) / 2));
      }
      score += top;
    }
    if (score > bestScore + 1e-9) {
      bestScore = score;
      best = o;
    }
  }
  return Math.round(best * 1000) / 1000;
}

export type { EvidenceKind };
