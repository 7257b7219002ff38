import { AbortMultipartUploadCommand } from '@aws-sdk/client-s3';
import { applyEvent, cancelledWithOpenUpload, forgetUploadId, openUploadsBefore } from '../services/recording-lifecycle';
import type { JobHandler } from './job-context';

/** Uploads untouched this long are abandoned: their parts are aborted and the recording marked failed. */
export const ABANDONED_AFTER_HOURS = 24;

/** Aborts abandoned multipart uploads so their parts stop taking space (the store keeps them otherwise). */
export const cleanupUploads: JobHandler<'uploads.cleanup'> = async (_data, ctx) => {
  const abort = (key: string, uploadId: string) =>
    ctx.s3.send(new AbortMultipartUploadCommand({ Bucket: ctx.bucket, Key: key, UploadId: uploadId })).catch((err: { name?: string }) => {
      if (err.name !== 'NoSuchUpload') throw err; // already gone is fine
    });
  const stale = await openUploadsBefore(ctx.deps, new Date(Date.now() - ABANDONED_AFTER_HOURS * 3600_000));
  for (const rec of stale) {
    if (rec.uploadId) await abort(rec.sourceKey, rec.uploadId);
    await applyEvent(ctx.deps, rec, 'upload-abandoned', {
      failureReason: 'This upload was not finished within a day, so it was cancelled. Upload the recording again.',
    });
  }
  // Cancelled uploads (their own state) whose browser did not get to abort them: abort once, then forget the id.
  const cancelled = await cancelledWithOpenUpload(ctx.deps);
  for (const rec of cancelled) {
    await abort(rec.sourceKey, rec.uploadId!);
    await forgetUploadId(ctx.deps, rec.id);
  }
  return { outcome: 'done', detail: `${stale.length} abandoned and ${cancelled.length} cancelled uploads cleaned up` };
};
