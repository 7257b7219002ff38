/**
 * Expands a plan into the expected schedule: the ordered segments a correctly marked
 * recording would have, with planned start times from a chosen start, and the totals.
 */
import type { Plan, PlanBlock } from './plan-schema';

/** Kinds a plan can produce (a subset of the timeline's segment kinds). */
export type PlannedKind = 'warmup' | 'work' | 'rest' | 'round-break' | 'cooldown' | 'talk';

/** One expected segment. Zero-length rests and round breaks are not emitted. */
export interface PlannedSegment {
  /** Position in the schedule, 0-based. */
  index: number;
  kind: PlannedKind;
  blockIndex: number;
  blockKind: PlanBlock['kind'];
  /** Station position within a circuit (0-based); for intervals always 0. */
  stationIndex?: number;
  exercise?: string;
  /** 1-based round of a circuit. */
  round?: number;
  /** 1-based set of an intervals block. */
  set?: number;
  startSeconds: number;
  seconds: number;
}

export interface ScheduleTotals {
  workSeconds: number;
  restSeconds: number;
  roundBreakSeconds: number;
  warmupSeconds: number;
  cooldownSeconds: number;
  talkSeconds: number;
  /** First planned start to last planned end. */
  classSeconds: number;
}

export interface ExpectedSchedule {
  startSeconds: number;
  segments: PlannedSegment[];
  totals: ScheduleTotals;
}

/**
 * Expands `plan` from `startSeconds` (default 0).
 *
 * Rests in circuits, exactly:
 * - within a round, every station is followed by its `restSeconds`;
 * - between rounds, `roundBreakReplacesLastRest: true` puts the round break in place of the
 *   last station's rest; `false` keeps that rest and adds the round break after it;
 * - after the last round there is no round break; `dropFinalRest: true` also leaves out the
 *   last station's rest there (the block ends on work).
 * Intervals: each set is work then rest; `dropFinalRest: true` leaves out the last set's rest.
 */
export function expandPlan(plan: Plan, startSeconds = 0): ExpectedSchedule {
  const { roundBreakReplacesLastRest, dropFinalRest } = plan.options;
  const segments: PlannedSegment[] = [];
  const totals: ScheduleTotals = {
    workSeconds: 0,
    restSeconds: 0,
    roundBreakSeconds: 0,
    warmupSeconds: 0,
    cooldownSeconds: 0,
    talkSeconds: 0,
    classSeconds: 0,
  };
  let at = startSeconds;

  const push = (seg: Omit<PlannedSegment, 'index' | 'startSeconds'>): void => {
    if (seg.seconds <= 0) return;
    segments.push({ ...seg, index: segments.length, startSeconds: at });
    at += seg.seconds;
    switch (seg.kind) {
      case 'work': totals.workSeconds += seg.seconds; break;
      case 'rest': totals.restSeconds += seg.seconds; break;
      case 'round-break': totals.roundBreakSeconds += seg.seconds; break;
      case 'warmup': totals.warmupSeconds += seg.seconds; break;
      case 'cooldown': totals.cooldownSeconds += seg.seconds; break;
      case 'talk': totals.talkSeconds += seg.seconds; break;
    }
  };

  plan.blocks.forEach((block, blockIndex) => {
    const blockKind = block.kind;
    switch (block.kind) {
      case 'warmup':
      case 'cooldown':
      case 'talk':
        push({ kind: block.kind, blockIndex, blockKind, seconds: block.seconds });
        break;
      case 'intervals':
        for (let set = 1; set <= block.sets; set++) {
          const base = { blockIndex, blockKind, stationIndex: 0, exercise: block.exercise, set };
          push({ ...base, kind: 'work', seconds: block.workSeconds });
          if (!(dropFinalRest && set === block.sets)) push({ ...base, kind: 'rest', seconds: block.restSeconds });
        }
        break;
      case 'circuit': {
        const last = block.stations.length - 1;
        for (let round = 1; round <= block.rounds; round++) {
          const finalRound = round === block.rounds;
          block.stations.forEach((station, stationIndex) => {
            const base = { blockIndex, blockKind, stationIndex, exercise: station.exercise, round };
            push({ ...base, kind: 'work', seconds: station.workSeconds });
            const isLast = stationIndex === last;
            const skipRest = isLast && (finalRound ? dropFinalRest : roundBreakReplacesLastRest);
            if (!skipRest) push({ ...base, kind: 'rest', seconds: station.restSeconds });
          });
          if (!finalRound) {
            push({ blockIndex, blockKind, round, kind: 'round-break', seconds: block.roundBreakSeconds });
          }
        }
        break;
      }
    }
  });

  totals.classSeconds = at - startSeconds;
  return { startSeconds, segments, totals };
}
