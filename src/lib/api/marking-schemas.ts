/**
 * API shapes of "Mark it for me": a recording's audio events (paged) and the proposed timeline.
 * One schema per input and output, shared by the endpoints, the editor and the OpenAPI document.
 */
import { z } from 'zod';
import { AUDIO_EVENT_KINDS } from '../audio/audio-events';
import { cueSchema, segmentSchema } from '../timeline/timeline-schema';

export const MAX_EVENTS_PAGE = 2000;

export const audioEventSchema = z
  .object({
    atSeconds: z.number().describe('Start, seconds from the start of the recording.'),
    kind: z.enum(AUDIO_EVENT_KINDS).describe('tone (timer beep), whistle, speech burst, pause in speech, energy-rise / energy-fall (music starting or stopping).'),
    strength: z.number().min(0).max(1).describe('How clearly the event stands out, 0–1.'),
    durationSeconds: z.number().min(0).describe('Length of the event in seconds (0 for a level change).'),
    frequencyHz: z.number().optional().describe('Pitch of a tone or whistle, Hz.'),
  })
  .meta({ id: 'AudioEvent' });

const count = (what: string, max: number, fallback: number) =>
  z.coerce
    .number({ error: `${what} must be a number.` })
    .int({ error: `${what} must be a whole number.` })
    .min(0, { error: `${what} cannot be negative.` })
    .max(max, { error: `${what} can be at most ${max}.` })
    .default(fallback);

export const recordingEventsQuery = z.object({
  offset: count('The offset', 10_000_000, 0).describe('Events to skip (from the previous page’s nextOffset). Default 0.'),
  limit: count('The limit', MAX_EVENTS_PAGE, 500)
    .refine((n) => n >= 1, { error: 'The limit must be at least 1.' })
    .describe(`Events per page, 1–${MAX_EVENTS_PAGE}. Default 500.`),
});

export const recordingEventsOutput = z
  .object({
    recordingId: z.string(),
    analyzed: z.boolean().describe('False while the audio has not been analysed yet (then there are no events).'),
    total: z.number().int(),
    events: z.array(audioEventSchema).describe('Ordered by time.'),
    nextOffset: z.number().int().nullable().describe('Offset of the next page, or null on the last page.'),
  })
  .meta({ id: 'RecordingEvents' });

/** The body of a proposal request: nothing yet (room for options later). */
export const proposeInput = z.strictObject({}, { error: 'Send an empty object {}: the proposal takes no options yet.' }).describe('Empty object.');

export const proposedBoundarySchema = z.object({
  atSeconds: z.number(),
  confidence: z.number().min(0).max(1).describe('0–1; below reviewBelow the editor asks for a check.'),
  evidence: z.enum(['tone', 'whistle', 'voice', 'energy', 'plan']).describe('What placed the boundary; plan = no evidence, laid out from the plan.'),
});

export const proposalOutput = z
  .object({
    segments: z.array(segmentSchema).describe('In exactly the timeline’s shape: save them with PUT /api/lessons/{id}/timeline.'),
    cues: z.array(cueSchema).describe('Countdown cues where beeps or a spoken count lead into a boundary.'),
    boundaries: z.array(proposedBoundarySchema).describe('Start of every segment, then the end of the last.'),
    method: z.enum(['audio-aligned', 'plan-only']),
    reviewBelow: z.number().describe('Confidence under which a boundary should be reviewed.'),
    recordingId: z.string(),
  })
  .meta({ id: 'TimelineProposal' });

export type RecordingEventsOutput = z.infer<typeof recordingEventsOutput>;
export type ProposalOutput = z.infer<typeof proposalOutput>;
