import { mkdir, stat } from 'node:fs/promises';
import { createReadStream } from 'node:fs';
import { join } from 'node:path';
import { PutObjectCommand } from '@aws-sdk/client-s3';
import { and, eq, ne } from 'drizzle-orm';
import { lessons, recordings } from '~/db/schema';
import { buildDemoVideoArgs } from '~/lib/media/demo-video-args';
import { demoSpans } from '~/lib/media/demo-spans';
import { runFfmpegCommand } from '../media/ffmpeg-runner';
import { getTimeline } from '../services/timelines';
import { recordingPrefix } from '../services/recordings';
import type { JobHandler } from './job-context';
import { cleanScratch, progressReporter } from './recording-files';

/**
 * Generates a demo class's recording with ffmpeg (coloured spans naming each part, a tone at
 * each boundary, following the class's marked timeline) and sends it through the same pipeline
 * as an upload. Skipped when the class already has a recording that did not fail.
 */
export const demoRecording: JobHandler<'recording.demo'> = async ({ lessonId }, ctx) => {
  const [lesson] = await ctx.deps.db.select().from(lessons).where(eq(lessons.id, lessonId));
  if (!lesson) return { outcome: 'skipped', detail: 'class is gone' };
  const existing = await ctx.deps.db
    .select({ id: recordings.id, state: recordings.state })
    .from(recordings)
    .where(and(eq(recordings.lessonId, lessonId), ne(recordings.state, 'failed')));
  const generating = existing.find((r) => r.state === 'uploading');
  if (existing.length && !generating) return { outcome: 'skipped', detail: 'class already has a recording' };

  const timeline = await getTimeline(ctx.deps, lesson.studioId, lesson.id);
  const mediaSeconds = lesson.mediaSeconds ?? Math.max(0, ...timeline.segments.map((s) => s.endSeconds));
  const id = generating?.id ?? crypto.randomUUID();
  const rec = { id, studioId: lesson.studioId, lessonId: lesson.id };
  if (!generating) {
    await ctx.deps.db.insert(recordings).values({
      ...rec,
      sourceKey: `${recordingPrefix(rec)}source.mp4`,
      fileName: `${lesson.slug}-demo.mp4`,
      contentType: 'video/mp4',
      sizeBytes: 0,
      step: 'generate',
    });
  }
  const dir = join(ctx.workDir, `demo-${id}`);
  await mkdir(dir, { recursive: true });
  const output = join(dir, 'demo.mp4');
  const command = buildDemoVideoArgs({ spans: demoSpans(timeline.segments, mediaSeconds), output, workDir: dir, width: 640, height: 360 });
  const report = progressReporter(ctx.deps, id, 'generate');
  await runFfmpegCommand(command, { durationSeconds: command.durationSeconds, signal: ctx.signal, onProgress: (p) => void report(p.percent) });
  const size = (await stat(output)).size;
  await ctx.s3.send(
    new PutObjectCommand({ Bucket: ctx.bucket, Key: `${recordingPrefix(rec)}source.mp4`, Body: createReadStream(output), ContentLength: size, ContentType: 'video/mp4' }),
    { abortSignal: ctx.signal },
  );
  await ctx.deps.db
    .update(recordings)
    .set({ state: 'processing', uploadId: 'generated', sizeBytes: size, step: 'probe', progress: 0, updatedAt: new Date() })
    .where(eq(recordings.id, id));
  await cleanScratch(dir);
  await ctx.send('recording.probe', { recordingId: id }, `recording.probe:${id}`);
  return { outcome: 'done', detail: `${Math.round(command.durationSeconds)} s generated` };
};
