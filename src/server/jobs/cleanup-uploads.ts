import { AbortMultipartUploadCommand } from '@aws-sdk/client-s3';
import { and, eq, isNotNull, lt, ne } from 'drizzle-orm';
import { recordings } from '~/db/schema';
import { CANCELLED_REASON, failRecording } from '../services/recordings';
import type { JobHandler } from './job-context';

/** Uploads untouched this long are abandoned: their parts are aborted and the recording marked failed. */
export const ABANDONED_AFTER_HOURS = 24;

/** Aborts abandoned multipart uploads so their parts stop taking space (the store keeps them otherwise). */
export const cleanupUploads: JobHandler<'uploads.cleanup'> = async (_data, ctx) => {
  const cutoff = new Date(Date.now() - ABANDONED_AFTER_HOURS * 3600_000);
  const stale = await ctx.deps.db
    .select()
    .from(recordings)
    .where(and(eq(recordings.state, 'uploading'), lt(recordings.updatedAt, cutoff)));
  for (const rec of stale) {
    if (rec.uploadId && rec.uploadId !== 'generated') {
      await ctx.s3
        .send(new AbortMultipartUploadCommand({ Bucket: ctx.bucket, Key: rec.sourceKey, UploadId: rec.uploadId }))
        .catch((err: { name?: string }) => {
          if (err.name !== 'NoSuchUpload') throw err; // already gone is fine
        });
    }
    await failRecording(ctx.deps, rec.id, 'This upload was not finished within a day, so it was cancelled. Upload the recording again.');
  }
  // Cancelled uploads whose browser did not get to abort them: abort once, then forget the id.
  const cancelled = await ctx.deps.db
    .select()
    .from(recordings)
    .where(and(eq(recordings.state, 'failed'), eq(recordings.failureReason, CANCELLED_REASON), isNotNull(recordings.uploadId), ne(recordings.uploadId, 'generated')));
  for (const rec of cancelled) {
    await ctx.s3
      .send(new AbortMultipartUploadCommand({ Bucket: ctx.bucket, Key: rec.sourceKey, UploadId: rec.uploadId! }))
      .catch((err: { name?: string }) => {
        if (err.name !== 'NoSuchUpload') throw err;
      });
    await ctx.deps.db.update(recordings).set({ uploadId: null }).where(eq(recordings.id, rec.id));
  }
  return { outcome: 'done', detail: `${stale.length} abandoned and ${cancelled.length} cancelled uploads cleaned up` };
};
