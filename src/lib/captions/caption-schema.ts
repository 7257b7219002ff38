/**
 * Captions of a class: the words spoken (and sounds that matter) as timed text members can turn
 * on, for members who are deaf or hard of hearing or follow with the sound off. Stored as plain
 * text cues (no markup): the WebVTT file members get is written from them (captions-vtt.ts).
 */
import { z } from 'zod';
import { noControlCharacters } from '../api/text-rules';
import { timeSchema } from '../timeline/timeline-schema';

/** Limits like the timeline's: a caption every second of a three-hour class still fits. */
export const MAX_CAPTION_CUES = 10_000;
export const MAX_CAPTION_TEXT = 300;
/** A caption file (WebVTT or SRT) is read into memory whole; 1 MiB is far above a class's needs. */
export const MAX_CAPTION_FILE_BYTES = 1024 * 1024;

/** A captions file as sent for import: WebVTT or SubRip text. */
export const captionFileText = z.string().describe('WebVTT or SubRip (.srt) text');

export const captionCueSchema = z
  .object({
    startSeconds: timeSchema('The caption start'),
    endSeconds: timeSchema('The caption end'),
    text: z
      .string({ error: 'A caption needs text.' })
      .trim()
      .min(1, { error: 'A caption needs text; remove the caption instead of leaving it empty.' })
      .max(MAX_CAPTION_TEXT, { error: `A caption can be at most ${MAX_CAPTION_TEXT} characters; split it in two.` })
      .regex(...noControlCharacters('The caption text', { multiline: true }))
      // A blank line would end the cue and "-->" would start a timing line in the WebVTT file.
      .refine((t) => !/\n[\t ]*\n|\r/.test(t), { error: 'A caption cannot contain an empty line; use at most one line break at a time.' })
      .refine((t) => !t.includes('-->'), { error: 'A caption cannot contain "-->"; write an arrow (→) instead.' }),
  })
  .refine((c) => c.endSeconds > c.startSeconds, { error: 'A caption must end after it starts.', path: ['endSeconds'] })
  .describe('One caption: plain text shown from start to end (seconds from the start of the recording).');
export type CaptionCue = z.infer<typeof captionCueSchema>;

/** BCP 47 language tag, as the track element's `srclang` takes it (e.g. `en`, `en-GB`, `pt-BR`). */
export const captionLanguageSchema = z
  .string({ error: 'Choose the language of the captions.' })
  .trim()
  .regex(/^[A-Za-z]{2,3}(?:-[A-Za-z0-9]{2,8})*$/, { error: 'The language must be a language tag such as en, en-GB or es.' })
  .describe('BCP 47 language tag of the captions (the track’s srclang).');

export const captionLabelSchema = z
  .string({ error: 'Give the captions a label members will see, such as “English captions”.' })
  .trim()
  .min(1, { error: 'Give the captions a label members will see, such as “English captions”.' })
  .max(60, { error: 'The label can be at most 60 characters.' })
  .regex(...noControlCharacters('The label'))
  .describe('The name members see in the captions menu.');

export const captionCuesSchema = z
  .array(captionCueSchema)
  .max(MAX_CAPTION_CUES, { error: `A class can have at most ${MAX_CAPTION_CUES.toLocaleString('en')} captions.` })
  .refine((cues) => cues.every((c, i) => i === 0 || c.startSeconds >= cues[i - 1]!.startSeconds), {
    // WebVTT §4.1: cue start times never go backwards.
    error: 'Captions must be in order of their start times.',
  });

/** The body of a captions save: the whole list, with the version the editor read (stale → 409). */
export const captionsPutSchema = z
  .object({
    version: z.number({ error: 'The captions version is missing; reload the page.' }).int().min(0),
    language: captionLanguageSchema,
    label: captionLabelSchema,
    cues: captionCuesSchema.describe('All captions of the class, by start time; an empty list removes the captions.'),
  })
  .meta({ id: 'CaptionsPut' });
export type CaptionsPut = z.infer<typeof captionsPutSchema>;

/** The captions of a class as stored (version 0 and no cues before the first save). */
export const captionsOutput = z
  .object({
    version: z.number().int(),
    language: z.string(),
    label: z.string(),
    cues: z.array(captionCueSchema),
    recordingSeconds: z.number().nullable().describe('Length of the class’s current recording; captions must end within it.'),
  })
  .meta({ id: 'Captions' });
export type CaptionsOutput = z.infer<typeof captionsOutput>;

export const captionsSavedOutput = z.object({ version: z.number().int(), cues: z.number().int() }).meta({ id: 'CaptionsSaved' });
export type CaptionsSavedOutput = z.infer<typeof captionsSavedOutput>;

/** Query of a caption file upload: the version read, and the language and label to store. */
export const captionsImportQuery = z.object({
  version: z.coerce.number({ error: 'The captions version is missing; reload the page.' }).int().min(0),
  language: captionLanguageSchema.default('en'),
  label: captionLabelSchema.default('English captions'),
});

/** What a published version carries (immutable like its chapters). */
export interface PublishedCaptions {
  language: string;
  label: string;
  cues: CaptionCue[];
}

/** Captions that end after the recording does: one message per cue, keyed like the schema's paths. */
export function captionsPastRecording(cues: readonly CaptionCue[], recordingSeconds: number): Record<string, string> {
  const fields: Record<string, string> = {};
  cues.forEach((c, i) => {
    if (c.endSeconds > recordingSeconds + 0.0005) {
      fields[`cues.${i}.endSeconds`] = `Caption ${i + 1} ends after the recording (${c.endSeconds.toFixed(3)} s of ${recordingSeconds.toFixed(3)} s); move its end inside the recording.`;
    }
  });
  return fields;
}

/**
 * The captions fitted to a recording that is now shorter: captions that start at or after its end
 * are dropped, captions that run past it end where it ends. The fix the editor offers.
 */
export function trimCaptionsToRecording(cues: readonly CaptionCue[], recordingSeconds: number): CaptionCue[] {
  return cues.filter((c) => c.startSeconds < recordingSeconds).map((c) => (c.endSeconds > recordingSeconds ? { ...c, endSeconds: recordingSeconds } : c));
}

/** The member's player preferences (captions on or off), remembered with their account. */
export const playerPreferencesPut = z
  .object({ captionsOn: z.boolean({ error: 'Say whether captions are on (true) or off (false).' }) })
  .meta({ id: 'PlayerPreferences' });
export type PlayerPreferencesPut = z.infer<typeof playerPreferencesPut>;
