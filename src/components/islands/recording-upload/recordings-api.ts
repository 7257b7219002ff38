import { useQuery } from '@tanstack/react-query';
import { apiCall } from '../api-client';
import {
  createRecordingInput,
  type CreateRecordingInput,
  type RecordingListOutput,
  type RecordingOutput,
  type SignedRequestOutput,
  type SignUploadInput,
} from '~/lib/api/recording-schemas';

export { ApiError } from '../api-client';

/** Sends JSON to our API; the messages speak of the upload. */
const call = <T,>(method: 'GET' | 'POST', path: string, body?: unknown, signal?: AbortSignal) =>
  apiCall<T>(method, path, body, {
    ...(signal ? { signal } : {}),
    signedOutMessage: 'Your session has ended. Sign in again, then add the file again.',
  });

/** What the widget announces for a file, with the same schema the server checks. */
export function announcementFor(file: { name?: string; size: number | null; type?: string }): CreateRecordingInput {
  return { fileName: file.name ?? '', sizeBytes: file.size ?? 0, contentType: file.type ?? '' };
}

/**
 * Checks an announcement in the browser with the server's own schema, plus the size limit the
 * page was given. Answers the first message to show, or null when the file may go.
 */
export function checkAnnouncement(input: CreateRecordingInput, maxUploadBytes: number, formatSize: (n: number) => string): string | null {
  const parsed = createRecordingInput.safeParse(input);
  if (!parsed.success) return parsed.error.issues[0]?.message ?? 'This file cannot be uploaded.';
  if (input.sizeBytes > maxUploadBytes) {
    const [size, limit] = distinctSizes(input.sizeBytes, maxUploadBytes, formatSize);
    return `This file is ${size}; the largest recording Roundmark takes is ${limit}. Export at a lower bitrate and upload again.`;
  }
  return null;
}

/** Two sizes formatted so they read differently (8.0 GB vs 8.0 GB would say nothing); exact bytes as a last resort. */
function distinctSizes(a: number, b: number, formatSize: (n: number) => string): [string, string] {
  const [fa, fb] = [formatSize(a), formatSize(b)];
  if (fa !== fb) return [fa, fb];
  const bytes = (n: number) => `${n.toLocaleString('en')} bytes`;
  return [bytes(a), bytes(b)];
}

/** Announces an upload; the server checks type and size and picks where the file goes. */
export const announceRecording = (lessonId: string, input: CreateRecordingInput) =>
  call<RecordingOutput>('POST', `/api/lessons/${encodeURIComponent(lessonId)}/recordings`, input);

/** Asks the server to presign one S3 request of this recording's multipart upload. */
export const signRecordingRequest = (recordingId: string, req: SignUploadInput) =>
  call<SignedRequestOutput>('POST', `/api/recordings/${encodeURIComponent(recordingId)}/sign`, req);

/** Tells the server the store has the whole file; it checks it and starts processing. */
export const completeRecording = (recordingId: string) =>
  call<RecordingOutput>('POST', `/api/recordings/${encodeURIComponent(recordingId)}/complete`);

/** Starts a failed recording's processing again. */
export const retryRecording = (recordingId: string) =>
  call<RecordingOutput>('POST', `/api/recordings/${encodeURIComponent(recordingId)}/retry`);

export const recordingsKey = (lessonId: string) => ['lesson', lessonId, 'recordings'] as const;

/** Recordings of a class, newest first; polls every 2 s while `poll` is on. */
export function useLessonRecordings(lessonId: string, initial: RecordingOutput[], poll: boolean) {
  return useQuery({
    queryKey: recordingsKey(lessonId),
    queryFn: async ({ signal }) =>
      (await call<RecordingListOutput>('GET', `/api/lessons/${encodeURIComponent(lessonId)}/recordings`, undefined, signal)).recordings,
    initialData: initial,
    staleTime: 1_000,
    refetchInterval: poll ? 2_000 : false,
    retry: 2,
  });
}

/** Puts a recording the server just answered into the list (replacing its older copy). */
export function upsertRecording(list: RecordingOutput[] | undefined, rec: RecordingOutput): RecordingOutput[] {
  const rest = (list ?? []).filter((r) => r.id !== rec.id);
  return [rec, ...rest].sort((a, b) => b.createdAt.localeCompare(a.createdAt));
}

/** Tells the server an unfinished upload was cancelled, so it stops showing as in progress. */
export const cancelRecording = (recordingId: string) => call<RecordingOutput>('POST', `/api/recordings/${recordingId}/cancel`);
