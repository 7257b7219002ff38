/**
 * The plan's JSON format. It is part of the public API (coaches and integrations write plans
 * by hand), so the field names here are fixed; more optional fields may be added later.
 * The same schema validates the endpoint body, the editor form and the OpenAPI document.
 */
import { z } from 'zod';

/** Every kind of block, in the order the builder offers them. */
export const PLAN_BLOCK_KINDS = ['warmup', 'circuit', 'intervals', 'amrap', 'emom', 'cooldown', 'talk'] as const;

/** A plan may describe at most 12 hours of class: longer input is almost surely a typo. */
export const MAX_PLAN_SECONDS = 12 * 3600;
/** Upper bounds that keep expansion and the check bounded for hand-written input. */
export const MAX_STATIONS = 500;
export const MAX_ROUNDS = 200;
export const MAX_SETS = 500;
export const MAX_BLOCKS = 200;
export const MAX_PLANNED_SEGMENTS = 20_000;

const seconds = (what: string) =>
  z
    .number({ error: `${what} must be a number of seconds.` })
    .int({ error: `${what} must be whole seconds.` })
    .positive({ error: `${what} must be more than 0 seconds.` })
    .max(MAX_PLAN_SECONDS, { error: `${what} can be at most ${MAX_PLAN_SECONDS} seconds (12 hours).` });

const secondsOrZero = (what: string) =>
  z
    .number({ error: `${what} must be a number of seconds.` })
    .int({ error: `${what} must be whole seconds.` })
    .nonnegative({ error: `${what} cannot be negative.` })
    .max(MAX_PLAN_SECONDS, { error: `${what} can be at most ${MAX_PLAN_SECONDS} seconds (12 hours).` });

/** An exercise is named by its name; a name the studio's list lacks is added to it. */
export const exerciseNameSchema = z
  .string({ error: 'The exercise needs a name.' })
  .trim()
  .min(1, { error: 'The exercise needs a name.' })
  .max(120, { error: 'An exercise name can be at most 120 characters.' })
  .regex(/^[^\p{Cc}]*$/u, { error: 'An exercise name must be one line without control characters.' })
  .describe('Exercise name, as in the studio exercise list (a new name is added to the list).');

const blockTitle = z
  .string()
  .trim()
  .min(1)
  .max(200)
  .regex(/^[^\p{Cc}]*$/u, { error: 'A title must be one line without control characters.' })
  .optional()
  .describe('Optional title shown for this block.');

/**
 * "Per side" and the switch pause, shared by a circuit's station and an intervals block: the
 * move is done on the left, then on the right, each for the work seconds.
 */
const perSideFields = (what: string) => ({
  perSide: z
    .boolean({ error: 'Per side must be true or false.' })
    .optional()
    .describe(`When true, ${what} is done on the left, then on the right, each for its work seconds.`),
  switchSeconds: secondsOrZero('The switch pause')
    .optional()
    .describe('Per-side only: seconds of pause between the left and the right side (0 or left out for none).'),
});

/** A switch pause without "per side" would be planned time nobody does. */
const switchNeedsPerSide = (s: { perSide?: boolean | undefined; switchSeconds?: number | undefined }): boolean =>
  s.perSide === true || !s.switchSeconds;
const switchNeedsPerSideMessage = (what: string) => ({
  error: `A switch pause is only for ${what} done per side: turn on "per side" or set the pause to 0.`,
  path: ['switchSeconds'],
});

export const stationSchema = z
  .object({
    exercise: exerciseNameSchema,
    workSeconds: seconds('Work').describe('Seconds of work at this station (per side when done per side).'),
    restSeconds: secondsOrZero('Rest').describe('Seconds of rest after this station (0 for none).'),
    ...perSideFields('the station'),
  })
  .refine(switchNeedsPerSide, switchNeedsPerSideMessage('a station'))
  .describe('One move inside a circuit, with its work and rest seconds.');

/** Every exercise list (AMRAP, EMOM) has the same bounds and the same words. */
const exerciseList = (format: string) =>
  z
    .array(exerciseNameSchema, { error: `The ${format} needs a list of exercises.` })
    .min(1, { error: `The ${format} needs at least one exercise.` })
    .max(MAX_STATIONS, { error: `The ${format} can have at most ${MAX_STATIONS} exercises.` });

/**
 * AMRAP, "as many rounds as possible": one timed span in which members repeat the list of
 * exercises at their own pace (fitness trade, common practice, no source). The recording has
 * one work span for it; the exercises are what members repeat inside it.
 */
export const amrapBlockSchema = z
  .object({
    kind: z.literal('amrap'),
    seconds: seconds('The AMRAP').describe('Length of the timed span, in seconds (12 minutes = 720).'),
    exercises: exerciseList('AMRAP').describe('The exercises of one round, repeated as often as members can.'),
    title: blockTitle,
  })
  .describe('AMRAP (as many rounds as possible): one timed work span with a list of exercises.');

/** An EMOM lasts at most this many minutes (the same bound as a circuit's rounds). */
export const MAX_EMOM_MINUTES = MAX_ROUNDS;

/**
 * EMOM, "every minute on the minute": a task starts at the top of every minute, and what is
 * left of the minute is rest; N minutes are N rounds (fitness trade, common practice, no
 * source). The exercises take turns, one per minute. The work seconds are a guide for laying
 * the marks out: how long members work is what the coach marks; the check tests the minute
 * boundaries.
 */
export const emomBlockSchema = z
  .object({
    kind: z.literal('emom'),
    minutes: z
      .number({ error: 'Minutes must be a number.' })
      .int({ error: 'Minutes must be a whole number.' })
      .min(1, { error: 'An EMOM needs at least 1 minute.' })
      .max(MAX_EMOM_MINUTES, { error: `An EMOM can last at most ${MAX_EMOM_MINUTES} minutes.` })
      .describe('Number of minutes (each minute is one round).'),
    exercises: exerciseList('EMOM').describe('Exercises taking turns, one per minute: minute 1 the first, minute 2 the second, and so on.'),
    workSeconds: z
      .number({ error: 'Work must be a number of seconds.' })
      .int({ error: 'Work must be whole seconds.' })
      .positive({ error: 'Work must be more than 0 seconds.' })
      .max(59, { error: 'Work must be less than 60 seconds: what is left of the minute is the rest.' })
      .describe('Expected work at the top of each minute, in seconds (1 to 59); the rest of the minute is rest.'),
    title: blockTitle,
  })
  .describe('EMOM (every minute on the minute): for a number of minutes, the exercises take turns, one per minute.');

export const warmupBlockSchema = z
  .object({ kind: z.literal('warmup'), seconds: seconds('The warm-up'), title: blockTitle })
  .describe('Warm-up of a fixed length.');

export const cooldownBlockSchema = z
  .object({ kind: z.literal('cooldown'), seconds: seconds('The cool-down'), title: blockTitle })
  .describe('Cool-down of a fixed length.');

export const talkBlockSchema = z
  .object({ kind: z.literal('talk'), seconds: seconds('The talk'), title: blockTitle })
  .describe('Talk (explanation, demonstration) of a fixed length.');

/**
 * A change to one round of a circuit: ladders and pyramids give each round its own work (and
 * rest) seconds; a round may leave stations out. Stations are numbered from 1, as coaches say.
 */
export const roundChangeSchema = z
  .object({
    round: z
      .number({ error: 'The round must be a number.' })
      .int({ error: 'The round must be a whole number.' })
      .min(1, { error: 'Rounds are numbered from 1.' })
      .describe('The round this change applies to (1 is the first round).'),
    workSeconds: seconds('Work').optional().describe('Seconds of work at every station in this round, instead of each station\'s own.'),
    restSeconds: secondsOrZero('Rest').optional().describe('Seconds of rest after every station in this round, instead of each station\'s own.'),
    skipStations: z
      .array(
        z
          .number({ error: 'A station to leave out must be a number.' })
          .int({ error: 'A station to leave out must be a whole number.' })
          .min(1, { error: 'Stations are numbered from 1.' }),
      )
      .max(MAX_STATIONS, { error: `A round can leave out at most ${MAX_STATIONS} stations.` })
      .optional()
      .describe('Stations (numbered from 1) this round leaves out.'),
  })
  .describe('A change to one round: its own work or rest seconds (ladder, pyramid), or stations it leaves out.');

export const circuitBlockSchema = z
  .object({
    kind: z.literal('circuit'),
    rounds: z
      .number({ error: 'Rounds must be a number.' })
      .int({ error: 'Rounds must be a whole number.' })
      .min(1, { error: 'A circuit needs at least 1 round.' })
      .max(MAX_ROUNDS, { error: `A circuit can have at most ${MAX_ROUNDS} rounds.` })
      .describe('Number of passes through all stations.'),
    roundBreakSeconds: secondsOrZero('The round break')
      .default(0)
      .describe('Seconds of rest between rounds (not after the last round). Defaults to 0.'),
    stations: z
      .array(stationSchema)
      .min(1, { error: 'A circuit needs at least one station.' })
      .max(MAX_STATIONS, { error: `A circuit can have at most ${MAX_STATIONS} stations.` })
      .describe('Stations in the order they are done.'),
    roundChanges: z
      .array(roundChangeSchema)
      .max(MAX_ROUNDS, { error: `A circuit can change at most ${MAX_ROUNDS} rounds.` })
      .optional()
      .describe('Per-round changes: ladders and pyramids, and stations a round leaves out.'),
    title: blockTitle,
  })
  .describe('Circuit: ordered stations done for a number of rounds, with a round break between rounds.');

export const intervalsBlockSchema = z
  .object({
    kind: z.literal('intervals'),
    exercise: exerciseNameSchema,
    sets: z
      .number({ error: 'Sets must be a number.' })
      .int({ error: 'Sets must be a whole number.' })
      .min(1, { error: 'Intervals need at least 1 set.' })
      .max(MAX_SETS, { error: `Intervals can have at most ${MAX_SETS} sets.` })
      .describe('Number of work/rest sets.'),
    workSeconds: seconds('Work').describe('Seconds of work in each set (per side when done per side).'),
    restSeconds: secondsOrZero('Rest').describe('Seconds of rest after each set.'),
    ...perSideFields('every set'),
    title: blockTitle,
  })
  .refine(switchNeedsPerSide, switchNeedsPerSideMessage('intervals'))
  .describe('Intervals: one exercise, work and rest repeated for a number of sets (each set left, then right, when done per side).');

export const planBlockSchema = z
  .discriminatedUnion('kind', [
    warmupBlockSchema,
    circuitBlockSchema,
    intervalsBlockSchema,
    amrapBlockSchema,
    emomBlockSchema,
    cooldownBlockSchema,
    talkBlockSchema,
  ], { error: 'Each block needs a kind: warmup, circuit, intervals, amrap, emom, cooldown or talk.' })
  .describe('One block of the plan.');

/*
 * Default tolerances. None of these comes from a published standard; they are the house
 * defaults, chosen as follows:
 * - workSeconds 2: a member following the interval clock notices a work interval that is a
 *   couple of seconds off; a coach's call ("go!") rarely lands closer than a second or two
 *   to the planned mark. Common practice, no source.
 * - restSeconds 5: rests (and round breaks) are looser in practice (water, moving to the
 *   next station) and members mind an early or late start less. Common practice, no source.
 * - blockSeconds 15: warm-up, cool-down and talk are free-flowing; a quarter minute either
 *   way does not change the class. Common practice, no source.
 * - gapSeconds 3: a few unmarked seconds between segments are usually a sloppy mark; longer
 *   unmarked stretches are probably a missed segment. Common practice, no source.
 * - advertisedPercent 10: classes are advertised in whole (often 5-minute) steps; 10 % is a
 *   Roundmark house rule, not a standard.
 */
export const DEFAULT_TOLERANCES = {
  workSeconds: 2,
  restSeconds: 5,
  blockSeconds: 15,
  gapSeconds: 3,
  advertisedPercent: 10,
} as const;

/*
 * Default options: both true, because the most common way coaches run a circuit is to rest
 * for the round break instead of (not on top of) the last station's rest, and to end the
 * last work interval straight into the cool-down. Common practice, no source. Coaches who do
 * otherwise set the option to false explicitly.
 */
export const DEFAULT_PLAN_OPTIONS = {
  roundBreakReplacesLastRest: true,
  dropFinalRest: true,
} as const;

const tolerance = (what: string, max: number) =>
  z
    .number({ error: `The ${what} tolerance must be a number.` })
    .nonnegative({ error: `The ${what} tolerance cannot be negative.` })
    .max(max, { error: `The ${what} tolerance can be at most ${max}.` });

export const tolerancesSchema = z
  .object({
    workSeconds: tolerance('work', 600)
      .default(DEFAULT_TOLERANCES.workSeconds)
      .describe('Allowed difference of a work interval from its planned length, in seconds. Default 2.'),
    restSeconds: tolerance('rest', 600)
      .default(DEFAULT_TOLERANCES.restSeconds)
      .describe('Allowed difference of a rest or round break from its planned length, in seconds. Default 5.'),
    blockSeconds: tolerance('block', 3600)
      .default(DEFAULT_TOLERANCES.blockSeconds)
      .describe('Allowed difference of a warm-up, cool-down or talk from its planned length, in seconds. Default 15.'),
    gapSeconds: tolerance('gap', 3600)
      .default(DEFAULT_TOLERANCES.gapSeconds)
      .describe('Longest unmarked stretch between two segments that is not reported, in seconds. Default 3.'),
    advertisedPercent: tolerance('advertised length', 100)
      .default(DEFAULT_TOLERANCES.advertisedPercent)
      .describe('Allowed difference of the class length from the advertised length, in percent. Default 10.'),
  })
  .describe('How far the marks may differ from the plan before the timing check reports it.');

export const planOptionsSchema = z
  .object({
    roundBreakReplacesLastRest: z
      .boolean()
      .default(DEFAULT_PLAN_OPTIONS.roundBreakReplacesLastRest)
      .describe(
        'When true, the round break takes the place of the last station\'s rest in every round but the last; ' +
          'when false, the last station\'s rest comes first and the round break follows it. Default true.',
      ),
    dropFinalRest: z
      .boolean()
      .default(DEFAULT_PLAN_OPTIONS.dropFinalRest)
      .describe(
        'When true, the rest after the last work interval of a circuit or intervals block (its last round or set) ' +
          'is left out. Default true.',
      ),
  })
  .describe('Explicit choices about rests, since coaches do both.');

/** Planned length of one block in seconds (used for the 12-hour bound and by expansion). */
export function blockPlannedSeconds(block: PlanBlock, options: PlanOptions): number {
  switch (block.kind) {
    case 'warmup':
    case 'cooldown':
    case 'talk':
      return block.seconds;
    case 'intervals': {
      const rest = block.restSeconds * (options.dropFinalRest ? block.sets - 1 : block.sets);
      const set = block.perSide === true ? block.workSeconds * 2 + (block.switchSeconds ?? 0) : block.workSeconds;
      return set * block.sets + rest;
    }
    case 'amrap':
      return block.seconds;
    case 'emom':
      // Every minute lasts a minute, the last one included: N minutes = N × 60 s.
      return block.minutes * 60;
    case 'circuit': {
      let total = 0;
      for (let round = 1; round <= block.rounds; round++) {
        const done = circuitRound(block, round);
        const finalRound = round === block.rounds;
        done.forEach((st, i) => {
          const isLast = i === done.length - 1;
          total += st.perSide ? st.workSeconds * 2 + st.switchSeconds : st.workSeconds;
          // The last station's rest is replaced by the round break, or dropped after the final round.
          if (!(isLast && (finalRound ? options.dropFinalRest : options.roundBreakReplacesLastRest))) total += st.restSeconds;
        });
        if (!finalRound) total += block.roundBreakSeconds;
      }
      return total;
    }
  }
}

/** One station as done in one round: its position, exercise and that round's seconds. */
export interface RoundStation {
  stationIndex: number;
  exercise: string;
  workSeconds: number;
  restSeconds: number;
  /** Done on the left, then on the right, each for `workSeconds`, with `switchSeconds` between. */
  perSide: boolean;
  switchSeconds: number;
}

/**
 * The stations of `round` (1-based) in order, with that round's work and rest seconds, leaving
 * out the stations the round skips. The one place that reads `roundChanges`.
 */
export function circuitRound(block: CircuitBlock, round: number): RoundStation[] {
  const change = block.roundChanges?.find((c) => c.round === round);
  const skip = new Set(change?.skipStations ?? []);
  const out: RoundStation[] = [];
  block.stations.forEach((s, stationIndex) => {
    if (skip.has(stationIndex + 1)) return;
    out.push({
      stationIndex,
      exercise: s.exercise,
      workSeconds: change?.workSeconds ?? s.workSeconds,
      restSeconds: change?.restSeconds ?? s.restSeconds,
      perSide: s.perSide === true,
      switchSeconds: s.perSide === true ? s.switchSeconds ?? 0 : 0,
    });
  });
  return out;
}

/**
 * Reports round changes that point past the circuit, repeat a round or leave a round empty;
 * true when there were none.
 */
function checkRoundChanges(block: CircuitBlock, blockIndex: number, ctx: z.RefinementCtx): boolean {
  const seen = new Set<number>();
  let ok = true;
  const report = (path: (string | number)[], message: string) => {
    ok = false;
    ctx.addIssue({ code: 'custom', path, message });
  };
  (block.roundChanges ?? []).forEach((c, i) => {
    const path = ['blocks', blockIndex, 'roundChanges', i];
    if (c.round > block.rounds) {
      report([...path, 'round'], `Round ${c.round} is past the circuit's ${block.rounds} rounds.`);
    }
    if (seen.has(c.round)) {
      report([...path, 'round'], `Round ${c.round} is changed twice; keep one change per round.`);
    }
    seen.add(c.round);
    for (const n of c.skipStations ?? []) {
      if (n > block.stations.length) {
        report([...path, 'skipStations'], `Station ${n} is past the circuit's ${block.stations.length} stations.`);
      }
    }
    const skipped = new Set((c.skipStations ?? []).filter((n) => n <= block.stations.length));
    if (skipped.size >= block.stations.length) {
      report([...path, 'skipStations'], `Round ${c.round} cannot leave out every station; lower the number of rounds instead.`);
    }
  });
  return ok;
}

/** Number of planned segments a block expands to (for the size bound). */
function blockSegmentCount(block: PlanBlock): number {
  // A station done per side is at most four (left, switch pause, right, rest).
  if (block.kind === 'circuit') return block.rounds * (block.stations.length * 4 + 1);
  if (block.kind === 'intervals') return block.sets * (block.perSide === true ? 4 : 2);
  if (block.kind === 'emom') return block.minutes * 2;
  return 1;
}

/** The plan's fields, shared by the plan itself and the versioned write that carries it. */
const planFields = {
  blocks: z
    .array(planBlockSchema)
    .min(1, { error: 'A plan needs at least one block.' })
    .max(MAX_BLOCKS, { error: `A plan can have at most ${MAX_BLOCKS} blocks.` })
    .describe('Blocks in the order they happen in the class.'),
  tolerances: tolerancesSchema.default(DEFAULT_TOLERANCES).describe('Tolerances; defaults apply when left out.'),
  options: planOptionsSchema.default(DEFAULT_PLAN_OPTIONS).describe('Options; defaults apply when left out.'),
};

/** Bounds that need the whole plan: the 12-hour limit and the number of planned intervals. */
function checkPlanBounds(plan: { blocks: PlanBlock[]; options: PlanOptions }, ctx: z.RefinementCtx): void {
  let roundsOk = true;
  plan.blocks.forEach((b, i) => {
    if (b.kind === 'circuit' && !checkRoundChanges(b, i, ctx)) roundsOk = false;
  });
  // Lengths of a circuit with impossible round changes mean nothing; its own messages say why.
  if (!roundsOk) return;
  const total = plan.blocks.reduce((sum, b) => sum + blockPlannedSeconds(b, plan.options), 0);
  if (total > MAX_PLAN_SECONDS) {
    ctx.addIssue({
      code: 'custom',
      path: ['blocks'],
      message: `This plan adds up to ${Math.round(total / 60)} minutes; a class can be at most 12 hours. Check the rounds and seconds.`,
    });
  }
  const count = plan.blocks.reduce((sum, b) => sum + blockSegmentCount(b), 0);
  if (count > MAX_PLANNED_SEGMENTS) {
    ctx.addIssue({
      code: 'custom',
      path: ['blocks'],
      message: `This plan has ${count} intervals; at most ${MAX_PLANNED_SEGMENTS} are allowed. Check the rounds and sets.`,
    });
  }
}

export const planSchema = z
  .object(planFields)
  .superRefine(checkPlanBounds)
  .describe('A class plan: blocks, tolerances for the timing check and options about rests.');

/** Writing a plan: the plan's fields plus the class version the edit is based on (a stale one is refused). */
export const planPutSchema = z
  .object({
    version: z
      .number({ error: 'The version must be a number.' })
      .int({ error: 'The version must be a whole number.' })
      .nonnegative({ error: 'The version cannot be negative.' })
      .describe('The class version this plan is based on (from GET …/plan); a stale version answers 409.'),
    ...planFields,
  })
  .superRefine(checkPlanBounds)
  .describe('A class plan with the class version it was read at.');

export type PlanPut = z.infer<typeof planPutSchema>;

/** A validated plan, defaults filled in. */
export type Plan = z.infer<typeof planSchema>;
/** A plan as written by hand (tolerances, options and round breaks may be left out). */
export type PlanInput = z.input<typeof planSchema>;
export type PlanBlock = z.infer<typeof planBlockSchema>;
export type CircuitBlock = z.infer<typeof circuitBlockSchema>;
export type IntervalsBlock = z.infer<typeof intervalsBlockSchema>;
export type AmrapBlock = z.infer<typeof amrapBlockSchema>;
export type EmomBlock = z.infer<typeof emomBlockSchema>;
export type Station = z.infer<typeof stationSchema>;
export type Tolerances = z.infer<typeof tolerancesSchema>;
export type PlanOptions = z.infer<typeof planOptionsSchema>;
