import { and, desc, eq } from 'drizzle-orm';
import {
  AbortMultipartUploadCommand,
  CompleteMultipartUploadCommand,
  CreateMultipartUploadCommand,
  HeadObjectCommand,
  ListPartsCommand,
  UploadPartCommand,
  type S3Client,
} from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import { lessons, recordings } from '~/db/schema';
import { fileExtension, type CreateRecordingInput, type RecordingOutput, type SignUploadInput } from '~/lib/api/recording-schemas';
import { AppError, notFound } from '../errors';
import { canHappen, canRetry } from '~/lib/media/recording-lifecycle';
import type { AppDeps } from '../app';
import { applyEvent, bindUploadId, insertRecording, statusOf, type RecordingRow } from './recording-lifecycle';

export type { RecordingRow };

/** Storage and limits a recording service needs. */
export interface MediaDeps extends AppDeps {
  s3: S3Client;
  bucket: string;
  maxUploadBytes: number;
  /** Queues a job (the web server passes pg-boss; tests may pass the real queue too). */
  enqueue: (name: 'recording.probe' | 'recording.package', recordingId: string) => Promise<void>;
}

/** Presigned URLs live 15 minutes: long enough for a slow part, short enough to be useless later. */
const SIGNED_URL_SECONDS = 15 * 60;

/** Storage prefix of one recording; studio and class ids keep tenants apart. */
export const recordingPrefix = (r: Pick<RecordingRow, 'studioId' | 'lessonId' | 'id'>) =>
  `studios/${r.studioId}/lessons/${r.lessonId}/recordings/${r.id}/`;

const humanSize = (bytes: number) =>
  bytes >= 1024 ** 3 ? `${(bytes / 1024 ** 3).toFixed(1)} GB` : `${Math.round(bytes / 1024 ** 2)} MB`;

/** A recording as the API shows it; media URLs go through our own authenticated route. */
export function toRecordingOutput(r: RecordingRow, currentId: string | null): RecordingOutput {
  const ready = r.state === 'ready';
  return {
    id: r.id,
    lessonId: r.lessonId,
    state: r.state,
    fileName: r.fileName,
    sizeBytes: r.sizeBytes,
    step: r.step,
    progress: r.progress,
    failureReason: r.failureReason,
    retryReason: r.state === 'processing' ? r.retryReason : null,
    warnings: r.warnings,
    durationSeconds: r.durationSeconds,
    containerSeconds: r.containerSeconds,
    loudnessLufs: r.loudnessLufs,
    width: r.width,
    height: r.height,
    isCurrent: r.id === currentId,
    canRetry: canRetry(statusOf(r)),
    posterUrl: ready ? `/media/${r.id}/poster.jpg` : null,
    playlistUrl: ready ? `/media/${r.id}/hls/master.m3u8` : null,
    peaksUrl: ready ? `/media/${r.id}/peaks.bin` : null,
    createdAt: r.createdAt.toISOString(),
  };
}

async function lessonOf(deps: AppDeps, studioId: string, lessonId: string) {
  const [lesson] = await deps.db
    .select({ id: lessons.id, currentRecordingId: lessons.currentRecordingId })
    .from(lessons)
    .where(and(eq(lessons.id, lessonId), eq(lessons.studioId, studioId)));
  if (!lesson) throw notFound('That class');
  return lesson;
}

/** A recording of the studio; another studio's answers "not found". */
export async function recordingOf(deps: AppDeps, studioId: string, recordingId: string): Promise<RecordingRow> {
  if (!/^[0-9a-f-]{36}$/i.test(recordingId)) throw notFound('That recording');
  const [row] = await deps.db
    .select()
    .from(recordings)
    .where(and(eq(recordings.id, recordingId), eq(recordings.studioId, studioId)));
  if (!row) throw notFound('That recording');
  return row;
}

/** Recordings of a class, newest first. */
export async function listRecordings(deps: AppDeps, studioId: string, lessonId: string): Promise<RecordingOutput[]> {
  const lesson = await lessonOf(deps, studioId, lessonId);
  const rows = await deps.db.select().from(recordings).where(eq(recordings.lessonId, lessonId)).orderBy(desc(recordings.createdAt));
  return rows.map((r) => toRecordingOutput(r, lesson.currentRecordingId));
}

/** Starts a recording: checks type and size, and fixes the storage key on the server. */
export async function createRecording(
  deps: MediaDeps,
  studioId: string,
  lessonId: string,
  userId: string,
  input: CreateRecordingInput,
): Promise<RecordingOutput> {
  const lesson = await lessonOf(deps, studioId, lessonId);
  if (input.sizeBytes > deps.maxUploadBytes) {
    throw new AppError(
      'too_large',
      `This file is ${humanSize(input.sizeBytes)}; the largest recording Roundmark takes is ${humanSize(deps.maxUploadBytes)}. Export at a lower bitrate and upload again.`,
      { sizeBytes: 'The file is too large.' },
    );
  }
  const id = crypto.randomUUID();
  const ext = fileExtension(input.fileName);
  const row = await insertRecording(deps, {
    id,
    studioId,
    lessonId,
    createdBy: userId,
    fileName: input.fileName,
    contentType: input.contentType,
    sizeBytes: input.sizeBytes,
    sourceKey: `${recordingPrefix({ studioId, lessonId, id })}source.${ext}`,
    source: 'upload',
  });
  return toRecordingOutput(row, lesson.currentRecordingId);
}

/**
 * Presigns one S3 request of the browser's multipart upload. Only the recording's own key and
 * multipart upload are ever signed; the upload id is bound to the recording on first use.
 */
export async function signUpload(
  deps: MediaDeps,
  studioId: string,
  recordingId: string,
  req: SignUploadInput,
): Promise<{ url: string; key: string }> {
  const rec = await recordingOf(deps, studioId, recordingId);
  // An abort may arrive after the upload was cancelled on the server: signing it is harmless.
  const abortingCancelled = req.method === 'DELETE' && rec.state === 'cancelled' && rec.uploadId === req.uploadId;
  if (rec.state !== 'uploading' && !abortingCancelled) {
    throw new AppError('conflict', 'This upload has already finished or was cancelled. Start a new upload.');
  }
  const Bucket = deps.bucket;
  const Key = rec.sourceKey;
  const opts = { expiresIn: SIGNED_URL_SECONDS };
  const signed = (url: string) => ({ url, key: Key });
  if (req.method === 'POST' && !req.uploadId) {
    return signed(
      await getSignedUrl(deps.s3, new CreateMultipartUploadCommand({ Bucket, Key, ContentType: rec.contentType || 'application/octet-stream' }), opts),
    );
  }
  if (!req.uploadId) {
    throw new AppError('invalid_input', 'Recordings upload in parts: this request needs an upload id.');
  }
  if (rec.uploadId && rec.uploadId !== req.uploadId) throw notFound('That upload');
  if (!rec.uploadId && !abortingCancelled) {
    // Bind the upload id the store gave the browser; a second, different id is refused above.
    if (!(await bindUploadId(deps, rec.id, req.uploadId))) throw notFound('That upload');
  }
  const UploadId = req.uploadId;
  switch (req.method) {
    case 'PUT': {
      if (!req.partNumber) throw new AppError('invalid_input', 'A part upload needs a part number.');
      // S3 parts are at least 5 MiB except the last, so the claimed size bounds the part count.
      const maxParts = Math.max(1, Math.ceil(rec.sizeBytes / (5 * 1024 * 1024)));
      if (req.partNumber > maxParts) {
        throw new AppError('too_large', 'This upload is sending more data than the file it announced. Start the upload again.');
      }
      return signed(await getSignedUrl(deps.s3, new UploadPartCommand({ Bucket, Key, UploadId, PartNumber: req.partNumber }), opts));
    }
    case 'GET':
      return signed(await getSignedUrl(deps.s3, new ListPartsCommand({ Bucket, Key, UploadId }), opts));
    case 'POST':
      return signed(await getSignedUrl(deps.s3, new CompleteMultipartUploadCommand({ Bucket, Key, UploadId }), opts));
    case 'DELETE':
      return signed(await getSignedUrl(deps.s3, new AbortMultipartUploadCommand({ Bucket, Key, UploadId }), opts));
  }
}

/**
 * Called by the browser after the store completed the upload: checks the stored object (the
 * size limit is enforced on what arrived, not on what was announced) and queues processing.
 */
export async function completeUpload(deps: MediaDeps, studioId: string, recordingId: string): Promise<RecordingOutput> {
  const rec = await recordingOf(deps, studioId, recordingId);
  const lesson = await lessonOf(deps, studioId, rec.lessonId);
  if (rec.state !== 'uploading') return toRecordingOutput(rec, lesson.currentRecordingId);
  let size: number;
  try {
    const head = await deps.s3.send(new HeadObjectCommand({ Bucket: deps.bucket, Key: rec.sourceKey }));
    size = head.ContentLength ?? 0;
  } catch {
    throw new AppError('conflict', 'The upload has not finished yet: the file is not in storage. Wait for 100 %, then try again.');
  }
  if (size > deps.maxUploadBytes) {
    await applyEvent(deps, rec, 'upload-refused', { failureReason: `The file is ${humanSize(size)}; the limit is ${humanSize(deps.maxUploadBytes)}.` });
  } else if (size === 0) {
    await applyEvent(deps, rec, 'upload-refused', { failureReason: 'This file is empty (0 bytes). Check the export and upload the recording again.' });
  } else if (await applyEvent(deps, rec, 'upload-finished', { sizeBytes: size })) {
    await deps.enqueue('recording.probe', rec.id);
  }
  return toRecordingOutput(await recordingOf(deps, studioId, recordingId), lesson.currentRecordingId);
}

/** Starts processing again from the probe, for a recording whose processing was interrupted on our side. */
export async function retryRecording(deps: MediaDeps, studioId: string, recordingId: string): Promise<RecordingOutput> {
  const rec = await recordingOf(deps, studioId, recordingId);
  if (!canHappen('retried', statusOf(rec))) {
    throw new AppError(
      'conflict',
      rec.state === 'failed'
        ? 'Processing this file again would fail the same way. Fix what the message says, then upload the file again.'
        : 'Only a recording whose processing was interrupted can be retried. Upload the file again instead.',
    );
  }
  // The stored file must still be there and within the limit: a retry never skips those checks.
  const head = await deps.s3.send(new HeadObjectCommand({ Bucket: deps.bucket, Key: rec.sourceKey })).catch(() => null);
  const size = head?.ContentLength ?? 0;
  if (size === 0 || size > deps.maxUploadBytes) {
    throw new AppError('conflict', 'The uploaded file is missing, empty or over the size limit, so processing it again would not help. Upload the file again.');
  }
  if (await applyEvent(deps, rec, 'retried')) await deps.enqueue('recording.probe', rec.id);
  const lesson = await lessonOf(deps, studioId, rec.lessonId);
  return toRecordingOutput(await recordingOf(deps, studioId, recordingId), lesson.currentRecordingId);
}

/**
 * Marks an unfinished upload as cancelled (its own state: the clean-up job selects by it). The
 * browser aborts the multipart upload itself (a signed DELETE); the clean-up job aborts it later
 * should the browser not have managed to.
 */
export async function cancelUpload(deps: MediaDeps, studioId: string, recordingId: string): Promise<RecordingOutput> {
  const rec = await recordingOf(deps, studioId, recordingId);
  if (canHappen('upload-cancelled', statusOf(rec))) await applyEvent(deps, rec, 'upload-cancelled');
  const lesson = await lessonOf(deps, studioId, rec.lessonId);
  return toRecordingOutput(await recordingOf(deps, studioId, recordingId), lesson.currentRecordingId);
}
