/**
 * The job worker: `npm run worker`. It imports nothing from astro:*; it shares the services,
 * the database and storage adapters with the web server.
 */
import { mkdir } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { and, eq, lt } from 'drizzle-orm';
import { recordings } from './db/schema';
import { createAppDeps } from './server/app';
import { env, settings } from './server/env';
import { JOB_NAMES, queue, sendJob, type JobName } from './server/queue';
import { storage } from './server/storage';
import { assertRegistryComplete, JOB_HANDLERS } from './server/jobs/registry';
import type { JobContext } from './server/jobs/job-context';

/** A processing recording whose progress has not moved for this long lost its worker (tests shorten it). */
const STALE_SECONDS = settings().ROUNDMARK_STALE_SECONDS;

assertRegistryComplete();
const deps = createAppDeps(env().DATABASE_URL);
const { s3, bucket } = storage();
// The process-wide queue, so use cases sending through deps.jobs share this connection.
const boss = await queue(env().DATABASE_URL);
const workDir = settings().ROUNDMARK_WORK_DIR ?? join(tmpdir(), 'roundmark-worker');
await mkdir(workDir, { recursive: true });
const stopping = new AbortController();

const ctx: JobContext = {
  deps,
  s3,
  bucket,
  boss,
  workDir,
  signal: stopping.signal,
  send: async (name, data, key) => {
    await sendJob(boss, name, data, key);
  },
};

/** Queues whose jobs run ffmpeg: each gets ROUNDMARK_MEDIA_CONCURRENCY pollers (pg-boss 10 runs one job per poller). */
const isMediaQueue = (name: JobName) => name.startsWith('recording.');
for (const name of JOB_NAMES) {
  const pollers = isMediaQueue(name) ? settings().ROUNDMARK_MEDIA_CONCURRENCY : 1;
  for (let i = 0; i < pollers; i++) await work(name);
}

async function work(name: JobName) {
  await boss.work(name, { batchSize: 1, pollingIntervalSeconds: 1 }, async ([job]) => {
    if (!job) return;
    const started = Date.now();
    try {
      const result = await (JOB_HANDLERS[name] as (d: unknown, c: JobContext) => Promise<{ outcome: string; detail?: string }>)(job.data, ctx);
      console.log(`${name} ${job.id}: ${result.outcome}${result.detail ? ` (${result.detail})` : ''} in ${Date.now() - started} ms`);
    } catch (err) {
      console.error(`${name} ${job.id} will be retried:`, err instanceof Error ? err.message : err);
      throw err;
    }
  });
}

/**
 * Recovers recordings whose worker died mid-step (progress updates double as a heartbeat):
 * their step is queued again; the jobs are idempotent, so the outcome is one set of outputs.
 */
async function requeueStale(): Promise<void> {
  const cutoff = new Date(Date.now() - STALE_SECONDS * 1000);
  const stale = await deps.db
    .update(recordings)
    .set({ updatedAt: new Date() })
    .where(and(eq(recordings.state, 'processing'), lt(recordings.updatedAt, cutoff)))
    .returning({ id: recordings.id, step: recordings.step });
  for (const r of stale) {
    const name: JobName = r.step === 'package' || r.step === 'upload-outputs' ? 'recording.package' : 'recording.probe';
    await sendJob(boss, name, { recordingId: r.id }, `${name}:${r.id}:recover:${Date.now()}`);
    console.log(`recovering ${r.id} from its ${r.step} step`);
  }
  // Demo recordings being generated (state uploading, step generate) are recovered the same way.
  const generating = await deps.db
    .update(recordings)
    .set({ updatedAt: new Date() })
    .where(and(eq(recordings.state, 'uploading'), eq(recordings.step, 'generate'), lt(recordings.updatedAt, cutoff)))
    .returning({ id: recordings.id, lessonId: recordings.lessonId });
  for (const r of generating) {
    await sendJob(boss, 'recording.demo', { lessonId: r.lessonId }, `recording.demo:${r.lessonId}:recover:${Date.now()}`);
    console.log(`recovering demo recording ${r.id}`);
  }
}
await requeueStale();
const sweeper = setInterval(
  () => void requeueStale().catch((e) => console.error('recovery sweep failed:', e)),
  Math.min(30, STALE_SECONDS / 2) * 1000,
);
await boss.schedule('uploads.cleanup', '17 * * * *', {});
await boss.schedule('lessons.publish-due', '* * * * *', {});
await boss.schedule('mail.trial-reminders', '41 * * * *', {});

console.log(`worker ready (${JOB_NAMES.join(', ')}), scratch ${workDir}`);

async function stop(signal: string) {
  console.log(`worker stopping (${signal})`);
  clearInterval(sweeper);
  stopping.abort();
  await boss.stop({ graceful: true, timeout: 10_000 }).catch(() => {});
  await deps.pool.end().catch(() => {});
  process.exit(0);
}
process.on('SIGTERM', () => void stop('SIGTERM'));
process.on('SIGINT', () => void stop('SIGINT'));
