/**
 * Expands a plan into the expected schedule: the ordered segments a correctly marked
 * recording would have, with planned start times from a chosen start, and the totals.
 */
import { z } from 'zod';
import { SEGMENT_FORMATS, SEGMENT_SIDES, type Segment, type SegmentFormat, type SegmentSide } from '../timeline/timeline-schema';
import { circuitRound, PLAN_BLOCK_KINDS, type Plan, type PlanBlock } from './plan-schema';

/** Kinds a plan can produce (a subset of the timeline's segment kinds). */
export const PLANNED_KINDS = ['warmup', 'work', 'rest', 'round-break', 'cooldown', 'talk'] as const;
export type PlannedKind = (typeof PLANNED_KINDS)[number];

/** One expected segment. Zero-length rests and round breaks are not emitted. */
export const plannedSegmentSchema = z
  .object({
    index: z.number().int().describe('Position in the schedule, 0-based'),
    kind: z.enum(PLANNED_KINDS),
    blockIndex: z.number().int(),
    blockKind: z.enum(PLAN_BLOCK_KINDS),
    stationIndex: z.number().int().optional().describe('Station position within a circuit (0-based); for intervals always 0'),
    exercise: z.string().optional(),
    round: z.number().int().optional().describe('1-based round of a circuit, or minute of an EMOM'),
    set: z.number().int().optional().describe('1-based set of an intervals block'),
    side: z.enum(SEGMENT_SIDES).optional().describe('For a station done per side: left or right (the switch pause is the left side\'s rest)'),
    format: z.enum(SEGMENT_FORMATS).optional().describe('amrap or emom for the spans of those blocks'),
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
 * - a station done per side is left work, the switch pause (a rest marked left), right work,
 *   then the station's rest (marked right); a switch pause of 0 is not emitted.
 * Intervals: each set is work then rest; `dropFinalRest: true` leaves out the last set's rest.
 * Intervals done per side: each set is left work, the switch pause (a rest marked left), right
 * work, then the set's rest (marked right), exactly as a station done per side.
 * AMRAP: one work span of the block's seconds (format `amrap`).
 * EMOM: per minute (= round), the work at the top of the minute and the rest of the minute as
 * rest (format `emom`); the last minute's rest is kept whatever `dropFinalRest` says, since an
 * EMOM of N minutes lasts N minutes.
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

  /** Where in its block a planned segment sits; absent fields stay undefined. */
  interface Place {
    stationIndex?: number;
    exercise?: string;
    round?: number;
    set?: number;
    side?: SegmentSide;
    format?: SegmentFormat;
  }
  // Objects are built with one fixed shape (absent fields undefined): a 12-hour plan has
  // thousands of segments and the check expands the plan on every run.
  const push = (kind: PlannedKind, seconds: number, blockIndex: number, blockKind: PlanBlock['kind'], place: Place = {}): void => {
    if (seconds <= 0) return;
    const { stationIndex, exercise, round, set, side, format } = place;
    segments.push({ index: segments.length, kind, blockIndex, blockKind, stationIndex, exercise, round, set, side, format, startSeconds: at, seconds });
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
      case 'intervals': {
        const perSide = block.perSide === true;
        for (let set = 1; set <= block.sets; set++) {
          const place = { stationIndex: 0, exercise: block.exercise, set };
          if (perSide) {
            // As a station done per side: left, the switch pause (the left side's rest), then right.
            push('work', block.workSeconds, blockIndex, 'intervals', { ...place, side: 'left' });
            push('rest', block.switchSeconds ?? 0, blockIndex, 'intervals', { ...place, side: 'left' });
          }
          const last = { ...place, ...(perSide ? { side: 'right' as const } : {}) };
          push('work', block.workSeconds, blockIndex, 'intervals', last);
          if (!(dropFinalRest && set === block.sets)) push('rest', block.restSeconds, blockIndex, 'intervals', last);
        }
        break;
      }
      case 'amrap':
        // One timed span; the exercises are repeated inside it, not marked one by one.
        push('work', block.seconds, blockIndex, 'amrap', { format: 'amrap' });
        break;
      case 'emom':
        // Every minute: the work at its top, the rest of the minute as rest, the last minute too.
        for (let minute = 1; minute <= block.minutes; minute++) {
          const place = { exercise: emomExercise(block.exercises, minute), round: minute, format: 'emom' as const };
          push('work', block.workSeconds, blockIndex, 'emom', place);
          push('rest', 60 - block.workSeconds, blockIndex, 'emom', place);
        }
        break;
      case 'circuit': {
        for (let round = 1; round <= block.rounds; round++) {
          const finalRound = round === block.rounds;
          // The round's own stations and seconds (ladders, pyramids, stations left out).
          const done = circuitRound(block, round);
          done.forEach((station, i) => {
            const { stationIndex, exercise } = station;
            if (station.perSide) {
              // Left, the switch pause (the left side's rest), then right; the station's rest follows the right.
              push('work', station.workSeconds, blockIndex, 'circuit', { stationIndex, exercise, round, side: 'left' });
              push('rest', station.switchSeconds, blockIndex, 'circuit', { stationIndex, exercise, round, side: 'left' });
            }
            const side = station.perSide ? ('right' as const) : undefined;
            push('work', station.workSeconds, blockIndex, 'circuit', { stationIndex, exercise, round, side });
            const isLast = i === done.length - 1;
            const skipRest = isLast && (finalRound ? dropFinalRest : roundBreakReplacesLastRest);
            if (!skipRest) push('rest', station.restSeconds, blockIndex, 'circuit', { stationIndex, exercise, round, side });
          });
          if (!finalRound) push('round-break', block.roundBreakSeconds, blockIndex, 'circuit', { round });
        }
        break;
      }
    }
  });

  totals.classSeconds = at - startSeconds;
  return { startSeconds, segments, totals };
}

/** The exercise of EMOM minute `minute` (1-based): the list takes turns, one per minute. */
export function emomExercise(exercises: readonly string[], minute: number): string {
  return exercises[(minute - 1) % exercises.length]!;
}

/**
 * The fields a mark laid out from a planned segment carries (exercise on work and rest,
 * round, set, side and format), so every place that turns the plan into marks agrees.
 */
export function markFieldsOf(p: PlannedSegment): Pick<Segment, 'exercise' | 'round' | 'set' | 'side' | 'format'> {
  return {
    ...(p.exercise !== undefined && (p.kind === 'work' || p.kind === 'rest') ? { exercise: p.exercise } : {}),
    ...(p.round !== undefined ? { round: p.round } : {}),
    ...(p.set !== undefined ? { set: p.set } : {}),
    ...(p.side !== undefined ? { side: p.side } : {}),
    ...(p.format !== undefined ? { format: p.format } : {}),
  };
}
