import { mkdir, readFile, stat } from 'node:fs/promises';
import { join } from 'node:path';
import { and, eq } from 'drizzle-orm';
import { PutObjectCommand } from '@aws-sdk/client-s3';
import { coverFrames, lessons, recordings } from '~/db/schema';
import { buildCoverFrameArgs } from '~/lib/media/cover-frame-args';
import { COVER_HEIGHT, COVER_WIDTH } from '~/lib/publishing/cover';
import { coverFramePath } from '~/lib/publishing/cover-frame';
import { formatEditorTime } from '~/lib/time/format-time';
import { FfmpegError, runFfmpeg } from '../media/ffmpeg-runner';
import { libraryChanged } from '../services/library';
import { recordingPrefix } from '../services/recordings';
import type { JobHandler } from './job-context';
import { cleanScratch, ensureSource } from './recording-files';

type FrameState = typeof coverFrames.$inferSelect.state;

/**
 * "Use this frame as cover": takes one frame of the class's recording at the moment staff paused
 * at, crops it to fill the cover size, stores it under the request's own key (a retry overwrites
 * it) and makes it the class's cover, unless the class moved on to another recording meanwhile.
 * A refusal that a retry cannot change (the file is gone, no frame at that moment) fails at once
 * with words staff can act on; anything else is retried, and the last try says it was interrupted.
 */
export const coverFrame: JobHandler<'cover.frame'> = async ({ frameId }, ctx, attempt) => {
  const [row] = await ctx.deps.db
    .select({ frame: coverFrames, rec: recordings })
    .from(coverFrames)
    .innerJoin(recordings, eq(recordings.id, coverFrames.recordingId))
    .where(eq(coverFrames.id, frameId));
  if (!row) return { outcome: 'skipped', detail: 'request is gone' };
  const { frame, rec } = row;
  if (frame.state === 'done' || frame.state === 'failed') return { outcome: 'skipped', detail: `already ${frame.state}` };
  const mark = (state: FrameState, failureReason: string | null = null) =>
    ctx.deps.db.update(coverFrames).set({ state, failureReason, updatedAt: new Date() }).where(eq(coverFrames.id, frameId));
  const at = formatEditorTime(frame.atSeconds);
  const fail = async (reason: string) => {
    await mark('failed', reason);
    return { outcome: 'failed' as const, detail: reason };
  };

  await mark('working');
  const dir = join(ctx.workDir, `cover-${frameId}`);
  const output = join(dir, 'cover.jpg');
  try {
    await mkdir(dir, { recursive: true });
    const source = join(dir, 'source');
    try {
      await ensureSource(ctx.s3, ctx.bucket, rec.sourceKey, source, rec.sizeBytes, ctx.signal);
    } catch (err) {
      if ((err as { name?: string }).name === 'NoSuchKey') return await fail('The recording’s file is no longer in storage. Upload the recording again, or upload a picture.');
      throw err;
    }
    const args = buildCoverFrameArgs({ input: source, output, atSeconds: frame.atSeconds, frameRate: rec.frameRate, width: COVER_WIDTH, height: COVER_HEIGHT, colorTransfer: rec.colorTransfer });
    try {
      await runFfmpeg(args, { signal: ctx.signal });
    } catch (err) {
      if (err instanceof FfmpegError && err.exitCode !== null) return await fail(`No picture could be taken at ${at}. Pause at another moment and try again, or upload a picture.`);
      throw err;
    }
    // ffmpeg exits 0 with no file when the moment is past the last frame it could decode.
    if (((await stat(output).catch(() => null))?.size ?? 0) === 0) {
      return await fail(`The recording has no frame at ${at}. Pause a little earlier and try again.`);
    }
    await ctx.s3.send(
      new PutObjectCommand({ Bucket: ctx.bucket, Key: `${recordingPrefix(rec)}media/${coverFramePath(frameId)}`, Body: await readFile(output), ContentType: 'image/jpeg' }),
      { abortSignal: ctx.signal },
    );
    const switched = await ctx.deps.db.transaction(async (tx) => {
      const set = await tx
        .update(lessons)
        .set({ coverPath: coverFramePath(frameId), coverChosen: true, updatedAt: new Date() })
        .where(and(eq(lessons.id, frame.lessonId), eq(lessons.currentRecordingId, rec.id)))
        .returning({ studioId: lessons.studioId });
      if (set[0]) await tx.update(coverFrames).set({ state: 'done', updatedAt: new Date() }).where(eq(coverFrames.id, frameId));
      return set[0];
    });
    if (!switched) return await fail('The class has a newer recording since you paused. Pause in that one and try again.');
    await libraryChanged(ctx.deps, switched.studioId);
    return { outcome: 'done', detail: `frame at ${at}` };
  } catch (err) {
    if (attempt.last) await mark('failed', 'Taking the picture was interrupted on our side. Try again in a moment.');
    else await mark('waiting');
    throw err;
  } finally {
    await cleanScratch(dir);
  }
};
