import { z } from 'zod';
import { noControlCharacters } from './text-rules';
import { RECORDING_STATES, RECORDING_STEPS } from '../media/recording-lifecycle';

/** Containers the media pipeline accepts, by file extension. */
export const ACCEPTED_EXTENSIONS = ['mp4', 'm4v', 'mov', 'webm', 'mkv'] as const;
/** MIME types browsers report for those containers ('' when the browser does not know, as with MKV). */
export const ACCEPTED_TYPES = ['video/mp4', 'video/x-m4v', 'video/quicktime', 'video/webm', 'video/x-matroska', 'application/octet-stream', ''];

/** Sound-only files by extension: they have no picture, which is what the coach needs to hear. */
export const SOUND_EXTENSIONS = ['m4a', 'mp3', 'wav', 'aac', 'ogg', 'oga', 'opus', 'flac', 'wma'] as const;

export const fileExtension = (name: string) => (name.match(/\.([A-Za-z0-9]+)$/)?.[1] ?? '').toLowerCase();

export const createRecordingInput = z
  .object({
    fileName: z.string().trim().min(1, { error: 'The file needs a name.' }).max(255).regex(...noControlCharacters('The file name')),
    sizeBytes: z.number().int().nonnegative().max(Number.MAX_SAFE_INTEGER),
    contentType: z.string().max(100).regex(...noControlCharacters('The file type')).default(''),
  })
  .superRefine((v, ctx) => {
    const ext = fileExtension(v.fileName);
    if ((SOUND_EXTENSIONS as readonly string[]).includes(ext)) {
      ctx.addIssue({
        code: 'custom',
        path: ['fileName'],
        message: `"${v.fileName}" is a sound file: it has no picture. Upload the video recording of the class (MP4, MOV, WebM or MKV).`,
      });
    } else if (!(ACCEPTED_EXTENSIONS as readonly string[]).includes(ext) || !ACCEPTED_TYPES.includes(v.contentType)) {
      ctx.addIssue({
        code: 'custom',
        path: ['fileName'],
        message: `Roundmark takes video files in MP4, MOV, WebM or MKV. "${v.fileName}" is not one of those: export the recording as MP4 and upload that.`,
      });
    }
    if (v.sizeBytes === 0) {
      ctx.addIssue({ code: 'custom', path: ['sizeBytes'], message: 'This file is empty (0 bytes). Check the export and upload the recording again.' });
    }
  })
  .meta({ id: 'CreateRecordingInput' });
export type CreateRecordingInput = z.infer<typeof createRecordingInput>;

/** One S3 request the upload widget asks us to sign (create, part, list, complete, abort). */
export const signUploadInput = z
  .object({
    method: z.enum(['POST', 'PUT', 'GET', 'DELETE']),
    key: z.string().max(1024).regex(...noControlCharacters('The key')).optional(),
    uploadId: z.string().min(1).max(1024).regex(...noControlCharacters('The upload id')).optional(),
    partNumber: z.number().int().min(1).max(10_000).optional(),
    contentType: z.string().max(100).regex(...noControlCharacters('The file type')).optional(),
  })
  .meta({ id: 'SignUploadInput' });
export type SignUploadInput = z.infer<typeof signUploadInput>;

export const recordingStates = RECORDING_STATES;

export const recordingOutput = z
  .object({
    id: z.string().uuid(),
    lessonId: z.string().uuid(),
    state: z.enum(recordingStates),
    fileName: z.string(),
    sizeBytes: z.number(),
    step: z.enum(RECORDING_STEPS).nullable(),
    progress: z.number(),
    failureReason: z.string().nullable(),
    retryReason: z.string().nullable().describe('While processing: why the last attempt failed; the step is being tried again.'),
    warnings: z.array(z.string()),
    durationSeconds: z.number().nullable().describe('The length used everywhere: what the video packets cover, when the container disagrees.'),
    containerSeconds: z.number().nullable().describe('The length the file claims, when it differs from durationSeconds by more than a second or is missing.'),
    loudnessLufs: z.number().nullable().describe('Integrated loudness (ITU-R BS.1770-4 / EBU R 128), LUFS; null without measurable sound.'),
    width: z.number().nullable(),
    height: z.number().nullable(),
    isCurrent: z.boolean(),
    canRetry: z.boolean().describe('Whether Retry can help: processing was interrupted on our side (not a refusal of the file).'),
    posterUrl: z.string().nullable(),
    playlistUrl: z.string().nullable(),
    peaksUrl: z.string().nullable(),
    createdAt: z.string(),
  })
  .meta({ id: 'Recording' });
export type RecordingOutput = z.infer<typeof recordingOutput>;

export const recordingListOutput = z.object({ recordings: z.array(recordingOutput) }).meta({ id: 'Recordings' });
export type RecordingListOutput = z.infer<typeof recordingListOutput>;

/** A presigned URL for one S3 request, always for the recording's own key. */
export const signedRequestOutput = z.object({ url: z.string().url(), key: z.string() }).meta({ id: 'SignedUploadRequest' });
export type SignedRequestOutput = z.infer<typeof signedRequestOutput>;
