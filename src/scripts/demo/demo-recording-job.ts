/**
 * Demo recordings for the invented scenario: not a production job. The worker registers this
 * queue only when demo data is on (DEMO_DATA=true, local set-ups and tests); the seed and the
 * tests queue it through {@link queueDemoRecording}.
 */
import { createReadStream } from 'node:fs';
import { mkdir, stat } from 'node:fs/promises';
import { join } from 'node:path';
import { PutObjectCommand } from '@aws-sdk/client-s3';
import type PgBoss from 'pg-boss';
import { and, eq, notInArray } from 'drizzle-orm';
import { lessons, recordings } from '~/db/schema';
import { runFfmpegCommand } from '~/server/media/ffmpeg-runner';
import { SOUNDTRACK_SAMPLE_RATE, writeSoundtrackPcm } from '~/server/media/render-soundtrack';
import { getTimeline } from '~/server/services/timelines';
import { recordingPrefix } from '~/server/services/recordings';
import { insertRecording } from '~/server/services/recording-lifecycle';
import type { JobContext, JobOutcome } from '~/server/jobs/job-context';
import { cleanScratch } from '~/server/jobs/recording-files';
import { buildDemoVideoArgs } from './demo-video-args';
import { DEMO_FPS, demoSoundtrackScore, demoSpans } from './demo-spans';
import { lessons as demoLessons } from './fernhill';

/** The demo queue's name; deliberately outside the production job names in src/server/queue.ts. */
export const DEMO_RECORDING_JOB = 'demo.recording';

// Demo media is small (640×360, ultrafast): a class takes well under a minute, so a job whose
// worker died is retried by pg-boss after 15 minutes without any recovery of our own.
const QUEUE: PgBoss.Queue = { name: DEMO_RECORDING_JOB, retryLimit: 2, retryDelay: 30, retryBackoff: true, expireInSeconds: 15 * 60 };

/** Queues the demo recording of one class (one job per class at a time). */
export async function queueDemoRecording(boss: PgBoss, lessonId: string): Promise<void> {
  await boss.createQueue(DEMO_RECORDING_JOB, QUEUE);
  await boss.send(DEMO_RECORDING_JOB, { lessonId }, { singletonKey: `${DEMO_RECORDING_JOB}:${lessonId}`, singletonSeconds: 60 });
}

/** Registers the demo queue with the worker's own job runner. */
export async function registerDemoRecordingJob(
  boss: PgBoss,
  ctx: JobContext,
  work: (name: string, handler: (data: unknown) => Promise<JobOutcome>) => Promise<void>,
): Promise<void> {
  await boss.createQueue(DEMO_RECORDING_JOB, QUEUE);
  await work(DEMO_RECORDING_JOB, (data) => demoRecording(data as { lessonId: string }, ctx));
}

/**
 * Generates a demo class's recording (coloured spans naming each part, following the class's
 * marked timeline, with a soundtrack: music bed, the coach talking through the parts, and the
 * class's change signal at every planned change), stores it, and only then adds the recording
 * (source `demo`), which goes through the same probe and packaging as an upload.
 * Skipped when the class already has a recording that did not fail.
 */
export async function demoRecording({ lessonId }: { lessonId: string }, ctx: JobContext): Promise<JobOutcome> {
  const [lesson] = await ctx.deps.db.select().from(lessons).where(eq(lessons.id, lessonId));
  if (!lesson) return { outcome: 'skipped', detail: 'class is gone' };
  const existing = await ctx.deps.db
    .select({ id: recordings.id })
    .from(recordings)
    .where(and(eq(recordings.lessonId, lessonId), notInArray(recordings.state, ['failed', 'cancelled'])));
  if (existing.length) return { outcome: 'skipped', detail: 'class already has a recording' };

  const timeline = await getTimeline(ctx.deps, lesson.studioId, lesson.id);
  const mediaSeconds = lesson.mediaSeconds ?? Math.max(0, ...timeline.segments.map((s) => s.endSeconds));
  const id = crypto.randomUUID();
  const rec = { id, studioId: lesson.studioId, lessonId: lesson.id };
  const sourceKey = `${recordingPrefix(rec)}source.mp4`;
  const dir = join(ctx.workDir, `demo-${id}`);
  await mkdir(dir, { recursive: true });
  try {
    const output = join(dir, 'demo.mp4');
    const spans = demoSpans(timeline.segments, mediaSeconds);
    const signal = demoLessons.find((l) => l.slug === lesson.slug)?.changeSignal ?? 'beeps';
    const audio = { path: join(dir, 'soundtrack.f32'), sampleRate: SOUNDTRACK_SAMPLE_RATE };
    await writeSoundtrackPcm(demoSoundtrackScore(spans, DEMO_FPS, signal), audio.path, dir);
    const command = buildDemoVideoArgs({ spans, output, workDir: dir, width: 640, height: 360, fps: DEMO_FPS, audio });
    await runFfmpegCommand(command, { signal: ctx.signal });
    const size = (await stat(output)).size;
    await ctx.s3.send(
      new PutObjectCommand({ Bucket: ctx.bucket, Key: sourceKey, Body: createReadStream(output), ContentLength: size, ContentType: 'video/mp4' }),
      { abortSignal: ctx.signal },
    );
    await insertRecording(ctx.deps, {
      ...rec,
      createdBy: null,
      fileName: `${lesson.slug}-demo.mp4`,
      contentType: 'video/mp4',
      sizeBytes: size,
      sourceKey,
      source: 'demo',
    });
    await ctx.send('recording.probe', { recordingId: id }, `recording.probe:${id}`);
    return { outcome: 'done', detail: `${Math.round(command.durationSeconds)} s generated` };
  } finally {
    await cleanScratch(dir);
  }
}
