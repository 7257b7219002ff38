/**
 * Expands a plan into the expected schedule: the ordered segments a correctly marked
 * recording would have, with planned start times from a chosen start, and the totals.
 */
import { z } from 'zod';
import { circuitRound, type Plan, type PlanBlock } from './plan-schema';

/** Kinds a plan can produce (a subset of the timeline's segment kinds). */
export const PLANNED_KINDS = ['warmup', 'work', 'rest', 'round-break', 'cooldown', 'talk'] as const;
export type PlannedKind = (typeof PLANNED_KINDS)[number];

/** One expected segment. Zero-length rests and round breaks are not emitted. */
export const plannedSegmentSchema = z
  .object({
    index: z.number().int().describe('Position in the schedule, 0-based'),
    kind: z.enum(PLANNED_KINDS),
    blockIndex: z.number().int(),
    blockKind: z.enum(['warmup', 'circuit', 'intervals', 'cooldown', 'talk'] satisfies PlanBlock['kind'][]),
    stationIndex: z.number().int().optional().describe('Station position within a circuit (0-based); for intervals always 0'),
    exercise: z.string().optional(),
    round: z.number().int().optional().describe('1-based round of a circuit'),
    set: z.number().int().optional().describe('1-based set of an intervals block'),
    startSeconds: z.number(),
    seconds: z.number(),
  })
  .meta({ id: 'PlannedSegment' });
export type PlannedSegment = z.infer<typeof plannedSegmentSchema>;

export const scheduleTotalsSchema = z.object({
  workSeconds: z.number(),
  restSeconds: z.number(),
  roundBreakSeconds: z.number(),
  warmupSeconds: z.number(),
  cooldownSeconds: z.number(),
  talkSeconds: z.number(),
  classSeconds: z.number().describe('First planned start to last planned end'),
});
export type ScheduleTotals = z.infer<typeof scheduleTotalsSchema>;

export const expectedScheduleSchema = z
  .object({ startSeconds: z.number(), segments: z.array(plannedSegmentSchema), totals: scheduleTotalsSchema })
  .meta({ id: 'ExpectedSchedule' });
export type ExpectedSchedule = z.infer<typeof expectedScheduleSchema>;

/**
 * Expands `plan` from `startSeconds` (default 0).
 *
 * Rests in circuits, exactly:
 * - within a round, every station is followed by its `restSeconds`;
 * - between rounds, `roundBreakReplacesLastRest: true` puts the round break in place of the
 *   last station's rest; `false` keeps that rest and adds the round break after it;
 * - after the last round there is no round break; `dropFinalRest: true` also leaves out the
 *   last station's rest there (the block ends on work).
 * - a round with a change (`roundChanges`) uses its own work/rest seconds and leaves out the
 *   stations it skips; "the last station" of a round is the last one it does.
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

  // Objects are built with one fixed shape (absent fields undefined): a 12-hour plan has
  // thousands of segments and the check expands the plan on every run.
  const push = (
    kind: PlannedKind,
    seconds: number,
    blockIndex: number,
    blockKind: PlanBlock['kind'],
    stationIndex?: number,
    exercise?: string,
    round?: number,
    set?: number,
  ): void => {
    if (seconds <= 0) return;
    segments.push({ index: segments.length, kind, blockIndex, blockKind, stationIndex, exercise, round, set, startSeconds: at, seconds });
    at += seconds;
    switch (kind) {
      case 'work': totals.workSeconds += seconds; break;
      case 'rest': totals.restSeconds += seconds; break;
      case 'round-break': totals.roundBreakSeconds += seconds; break;
      case 'warmup': totals.warmupSeconds += seconds; break;
      case 'cooldown': totals.cooldownSeconds += seconds; break;
      case 'talk': totals.talkSeconds += seconds; break;
    }
  };

  plan.blocks.forEach((block, blockIndex) => {
    switch (block.kind) {
      case 'warmup':
      case 'cooldown':
      case 'talk':
        push(block.kind, block.seconds, blockIndex, block.kind);
        break;
      case 'intervals':
        for (let set = 1; set <= block.sets; set++) {
          push('work', block.workSeconds, blockIndex, 'intervals', 0, block.exercise, undefined, set);
          if (!(dropFinalRest && set === block.sets)) {
            push('rest', block.restSeconds, blockIndex, 'intervals', 0, block.exercise, undefined, set);
          }
        }
        break;
      case 'circuit': {
        for (let round = 1; round <= block.rounds; round++) {
          const finalRound = round === block.rounds;
          // The round's own stations and seconds (ladders, pyramids, stations left out).
          const done = circuitRound(block, round);
          done.forEach((station, i) => {
            const { stationIndex } = station;
            push('work', station.workSeconds, blockIndex, 'circuit', stationIndex, station.exercise, round);
            const isLast = i === done.length - 1;
            const skipRest = isLast && (finalRound ? dropFinalRest : roundBreakReplacesLastRest);
            if (!skipRest) push('rest', station.restSeconds, blockIndex, 'circuit', stationIndex, station.exercise, round);
          });
          if (!finalRound) push('round-break', block.roundBreakSeconds, blockIndex, 'circuit', undefined, undefined, round);
        }
        break;
      }
    }
  });

  totals.classSeconds = at - startSeconds;
  return { startSeconds, segments, totals };
}
