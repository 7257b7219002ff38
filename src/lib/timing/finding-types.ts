/** Shapes of the timing check's result: zod schemas (the API documents them) and their types. */
import { z } from 'zod';
import { scheduleTotalsSchema } from '../plan/expand-plan';
import { PLAN_BLOCK_KINDS } from '../plan/plan-schema';
import { SEGMENT_FORMATS, SEGMENT_SIDES } from '../timeline/timeline-schema';

/** Exactly the finding codes of the public API. */
export const FINDING_CODES = [
  'overlap',
  'gap',
  'outside-media',
  'work-too-long',
  'work-too-short',
  'rest-too-long',
  'rest-too-short',
  'block-length',
  'missing-station',
  'unexpected-station',
  'out-of-order',
  'round-count',
  'emom-minute',
  'length-vs-advertised',
  'cue-outside-segment',
  'countdown-late',
] as const;

export type FindingCode = (typeof FINDING_CODES)[number];
export const SEVERITIES = ['error', 'warning', 'info'] as const;
export type Severity = (typeof SEVERITIES)[number];

/** Rank used to order findings at the same time: errors first. */
export const SEVERITY_RANK: Record<Severity, number> = { error: 0, warning: 1, info: 2 };

/** One change a suggested fix makes: set a segment's start or end to `value` seconds. */
export const fixChangeSchema = z
  .object({ segmentId: z.string(), field: z.enum(['startSeconds', 'endSeconds']), value: z.number() })
  .meta({ id: 'FixChange' });
export type FixChange = z.infer<typeof fixChangeSchema>;

/** The planned work interval a `missing-station` finding is about. */
export const missingWorkSchema = z.object({
  blockIndex: z.number().int(),
  stationIndex: z.number().int().optional().describe('0-based station of a circuit'),
  round: z.number().int().optional().describe('1-based round of a circuit, or minute of an EMOM'),
  set: z.number().int().optional().describe('1-based set of intervals'),
  exercise: z.string().optional(),
  side: z.enum(SEGMENT_SIDES).optional().describe('For a station done per side: the side that is not marked'),
  format: z.enum(SEGMENT_FORMATS).optional().describe('amrap or emom, for the mark that fills it'),
  seconds: z.number().describe('Planned length of the work interval'),
});
export type MissingWork = z.infer<typeof missingWorkSchema>;

export const findingSchema = z
  .object({
    code: z.enum(FINDING_CODES),
    severity: z.enum(SEVERITIES),
    atSeconds: z.number().describe('Where in the recording the finding is, in seconds'),
    segmentIds: z.array(z.string()),
    cueIds: z.array(z.string()).optional().describe('Ids of cues concerned (cue findings only)'),
    message: z.string().describe('Plain-language message: what happened and what to do'),
    fix: z.union([fixChangeSchema, z.array(fixChangeSchema)]).optional().describe('A suggested fix: one change, or several applied together'),
    missing: missingWorkSchema
      .optional()
      .describe('missing-station only: the planned work interval that is not marked, so the editor can mark it at the playhead or leave it out of the plan'),
  })
  .meta({ id: 'Finding' });
export type Finding = z.infer<typeof findingSchema>;

const roundTotalsSchema = z.object({
  round: z.number().int(),
  plannedWorkSeconds: z.number(),
  markedWorkSeconds: z.number(),
  plannedRestSeconds: z.number(),
  markedRestSeconds: z.number(),
});
export type RoundTotals = z.infer<typeof roundTotalsSchema>;

const blockTotalsSchema = z.object({
  blockIndex: z.number().int(),
  kind: z.enum(PLAN_BLOCK_KINDS),
  plannedSeconds: z.number(),
  markedSeconds: z.number(),
  plannedWorkSeconds: z.number(),
  markedWorkSeconds: z.number(),
  plannedRestSeconds: z.number(),
  markedRestSeconds: z.number(),
  rounds: z.array(roundTotalsSchema).describe('Circuits: per round; intervals: per set; EMOM: per minute'),
});
export type BlockTotals = z.infer<typeof blockTotalsSchema>;

// The same seconds per kind as the plan's schedule totals, counted over marked or planned segments.
const kindTotalsSchema = scheduleTotalsSchema.extend({
  classSeconds: z.number().describe('First segment start to last segment end'),
});
export type KindTotals = z.infer<typeof kindTotalsSchema>;

export const checkTotalsSchema = z
  .object({
    planned: kindTotalsSchema,
    marked: kindTotalsSchema.extend({ introSeconds: z.number(), outroSeconds: z.number() }),
    blocks: z.array(blockTotalsSchema),
    advertisedSeconds: z.number().nullable(),
    classVsAdvertisedSeconds: z.number().nullable().describe('Marked class length minus advertised length (null without an advertised length)'),
    mediaSeconds: z.number().nullable(),
  })
  .meta({ id: 'CheckTotals' });
export type CheckTotals = z.infer<typeof checkTotalsSchema>;

export const checkResultSchema = z.object({
  ok: z.boolean().describe('True when there is no finding of severity `error`'),
  findings: z.array(findingSchema),
  totals: checkTotalsSchema,
});
export type CheckResult = z.infer<typeof checkResultSchema>;

export interface CheckContext {
  /** Length of the recording; without it `outside-media` is not checked. */
  mediaSeconds?: number | null;
  /** Advertised length in minutes; without it `length-vs-advertised` is not checked. */
  advertisedMinutes?: number | null;
}
