/**
 * Timeline schemas: marked segments and coaching cues of one recording, and the body of a
 * timeline save. Times are seconds from the start of the recording, rounded to milliseconds.
 */
import { z } from 'zod';
import { INT4_MAX, noControlCharacters } from '../api/text-rules';
import { roundToMillis } from '../time/format-time';

export const SEGMENT_KINDS = ['intro', 'warmup', 'work', 'rest', 'round-break', 'cooldown', 'outro', 'talk'] as const;
/** A station done per side is marked twice: left, then right. */
export const SEGMENT_SIDES = ['left', 'right'] as const;
/** Timed formats whose marks read differently in chapters and on the clock. */
export const SEGMENT_FORMATS = ['amrap', 'emom'] as const;
export const CUE_KINDS = ['countdown', 'form', 'option', 'safety', 'note'] as const;
/** A recording of more than a day is not a class; this bound catches unit mix-ups (ms vs s). */
export const MAX_TIMELINE_SECONDS = 24 * 3600;
export const MAX_SEGMENTS = 5000;
export const MAX_CUES = 20_000;

export const segmentKindSchema = z.enum(SEGMENT_KINDS, {
  error: `The segment kind must be one of: ${SEGMENT_KINDS.join(', ')}.`,
});
export const cueKindSchema = z.enum(CUE_KINDS, { error: `The cue kind must be one of: ${CUE_KINDS.join(', ')}.` });

/** Ids are short and safe in URLs, CSV and WebVTT cue identifiers (no spaces, never `-->`). */
export const timelineIdSchema = z
  .string({ error: 'Every segment and cue needs an id.' })
  .regex(/^[A-Za-z0-9_.:-]{1,64}$/, {
    error: 'An id is 1 to 64 letters, digits or the characters _ . : - (no spaces).',
  })
  .describe('Identifier, unique within the timeline.');

export const timeSchema = (what: string) =>
  z
    .number({ error: `${what} must be a number of seconds.` })
    .refine(Number.isFinite, { error: `${what} must be a finite number of seconds.` })
    .refine((v) => v >= 0, { error: `${what} cannot be before the start of the recording (below 0).` })
    .refine((v) => v <= MAX_TIMELINE_SECONDS, { error: `${what} is more than 24 hours into the recording.` })
    .transform(roundToMillis)
    .describe(`${what}, in seconds from the start of the recording (rounded to milliseconds).`);

const oneLine = (what: string, max: number) =>
  z
    .string()
    .trim()
    .min(1, { error: `${what} cannot be empty; leave it out instead.` })
    .max(max, { error: `${what} can be at most ${max} characters.` })
    .regex(/^[^\p{Cc}]*$/u, { error: `${what} must be one line without control characters.` });

const positiveCount = (what: string) =>
  z
    .number({ error: `${what} must be a number.` })
    .int({ error: `${what} must be a whole number.` })
    .min(1, { error: `${what} starts at 1.` })
    .max(1000, { error: `${what} can be at most 1000.` });

export const segmentSchema = z
  .object({
    id: timelineIdSchema,
    kind: segmentKindSchema.describe('What happens in this span.'),
    startSeconds: timeSchema('The start'),
    endSeconds: timeSchema('The end'),
    exercise: oneLine('The exercise', 120).optional().describe('Exercise of a work (or rest) segment.'),
    round: positiveCount('The round').optional().describe('Round of a circuit, from 1.'),
    set: positiveCount('The set').optional().describe('Set of an intervals block, from 1.'),
    title: oneLine('The title', 200).optional().describe('Title shown as the chapter name.'),
    side: z
      .enum(SEGMENT_SIDES, { error: 'The side must be left or right.' })
      .optional()
      .describe('For a station done per side: which side this span is (left, then right).'),
    format: z
      .enum(SEGMENT_FORMATS, { error: 'The format must be amrap or emom.' })
      .optional()
      .describe('The timed format this span belongs to: amrap (as many rounds as possible) or emom (every minute on the minute).'),
  })
  .refine((s) => s.endSeconds > s.startSeconds, {
    error: 'A segment must end after it starts.',
    path: ['endSeconds'],
  })
  .describe('A marked span of the recording.');

export const cueSchema = z
  .object({
    id: timelineIdSchema,
    atSeconds: timeSchema('The cue time'),
    kind: cueKindSchema.describe('Kind of coaching note.'),
    text: z
      .string({ error: 'A cue needs text.' })
      .trim()
      .min(1, { error: 'A cue needs text.' })
      .max(500, { error: 'A cue text can be at most 500 characters.' })
      .regex(...noControlCharacters('The cue text', { multiline: true }))
      .describe('What the coach says or shows at this moment.'),
  })
  .describe('A point in time with a coaching note.');

function refineUniqueIds(items: readonly { id: string }[], what: string, ctx: z.RefinementCtx, path: string): void {
  const seen = new Set<string>();
  items.forEach((item, index) => {
    if (seen.has(item.id)) {
      ctx.addIssue({ code: 'custom', path: [path, index, 'id'], message: `Two ${what} share the id "${item.id}"; ids must be unique.` });
    }
    seen.add(item.id);
  });
}

export const timelineContentSchema = z
  .object({
    segments: z.array(segmentSchema).max(MAX_SEGMENTS, { error: `A timeline can have at most ${MAX_SEGMENTS} segments.` }),
    cues: z.array(cueSchema).max(MAX_CUES, { error: `A timeline can have at most ${MAX_CUES} cues.` }),
  })
  .superRefine((t, ctx) => {
    refineUniqueIds(t.segments, 'segments', ctx, 'segments');
    refineUniqueIds(t.cues, 'cues', ctx, 'cues');
  });

/** Body of a timeline save: the version read before editing, and the full new content. */
export const timelinePutSchema = z
  .object({
    version: z
      .number({ error: 'The version must be a number.' })
      .int({ error: 'The version must be a whole number.' })
      .nonnegative({ error: 'The version cannot be negative.' })
      .max(INT4_MAX, { error: 'That version does not exist; reload the timeline.' })
      .describe('The version this edit is based on (0 before the first save); a stale version is refused.'),
    segments: timelineContentSchema.shape.segments.describe('All segments; they replace the stored ones.'),
    cues: timelineContentSchema.shape.cues.describe('All cues; they replace the stored ones.'),
  })
  .superRefine((t, ctx) => {
    refineUniqueIds(t.segments, 'segments', ctx, 'segments');
    refineUniqueIds(t.cues, 'cues', ctx, 'cues');
  })
  .describe('A whole timeline, saved in one go.');

export type SegmentKind = (typeof SEGMENT_KINDS)[number];
export type SegmentSide = (typeof SEGMENT_SIDES)[number];
export type SegmentFormat = (typeof SEGMENT_FORMATS)[number];
export type CueKind = (typeof CUE_KINDS)[number];
export type Segment = z.infer<typeof segmentSchema>;
export type Cue = z.infer<typeof cueSchema>;
/** Segments and cues of one recording (order not significant). */
export type Timeline = z.infer<typeof timelineContentSchema>;
export type TimelinePut = z.infer<typeof timelinePutSchema>;
