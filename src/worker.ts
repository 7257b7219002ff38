/**
 * The job worker: `npm run worker`. It only wires the handlers to the queue; what a job does
 * lives in src/server/jobs, and recovering lost recording steps in the recording lifecycle service.
 * It imports nothing from astro:*; it shares the services, database and storage with the web server.
 */
import { mkdir } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createAppDeps } from './server/app';
import { env, settings } from './server/env';
import { hasPendingRecordingJob, JOB_NAMES, queue, sendJob, type JobName } from './server/queue';
import { storage } from './server/storage';
import { assertRegistryComplete, JOB_HANDLERS } from './server/jobs/registry';
import type { JobContext, JobOutcome } from './server/jobs/job-context';
import { recoverLostSteps } from './server/services/recording-lifecycle';
import { recordingsWithoutEvents } from './server/services/recording-events';

assertRegistryComplete();
const options = settings();
const staleSeconds = options.ROUNDMARK_STALE_SECONDS;
const deps = createAppDeps(env().DATABASE_URL);
const { s3, bucket } = storage();
// The process-wide queue, so use cases sending through deps.jobs share this connection.
const boss = await queue(env().DATABASE_URL);
const workDir = options.ROUNDMARK_WORK_DIR ?? join(tmpdir(), 'roundmark-worker');
await mkdir(workDir, { recursive: true });
const stopping = new AbortController();

const ctx: JobContext = {
  deps,
  s3,
  bucket,
  boss,
  workDir,
  signal: stopping.signal,
  heartbeatSeconds: Math.max(1, staleSeconds / 3),
  send: async (name, data, key) => {
    await sendJob(boss, name, data, key);
  },
};

/** Runs one handler per job and logs its outcome; throwing hands the job back to pg-boss for a retry. */
async function work(name: string, handler: (data: unknown, attempt: { last: boolean }) => Promise<JobOutcome>): Promise<void> {
  // Filled in once pg-boss names the poller; a job can only arrive after that fetch round trip.
  const poller = { id: '' };
  poller.id = await boss.work(name, { batchSize: 1, pollingIntervalSeconds: 1, includeMetadata: true }, async ([job]) => {
    if (!job) return;
    const started = Date.now();
    try {
      const result = await handler(job.data, { last: job.retryCount >= job.retryLimit });
      console.log(`${name} ${job.id}: ${result.outcome}${result.detail ? ` (${result.detail})` : ''} in ${Date.now() - started} ms`);
    } catch (err) {
      console.error(`${name} ${job.id} failed (attempt ${job.retryCount + 1} of ${job.retryLimit + 1}):`, err instanceof Error ? err.message : err);
      throw err;
    } finally {
      // pg-boss waits its polling interval after every job, so a backlog drained at one job a
      // second (eleven sign-ups: the last confirmation mail 9 s late). Asking for the next job at
      // once keeps the wait only for an empty queue or a failed fetch.
      if (poller.id) boss.notifyWorker(poller.id);
    }
  });
}

/** Queues whose jobs run ffmpeg: each gets ROUNDMARK_MEDIA_CONCURRENCY pollers (pg-boss 10 runs one job per poller). */
const isMediaQueue = (name: JobName) => name.startsWith('recording.');
for (const name of JOB_NAMES) {
  const handler = JOB_HANDLERS[name] as (d: unknown, c: JobContext, a: { last: boolean }) => Promise<JobOutcome>;
  const pollers = isMediaQueue(name) ? options.ROUNDMARK_MEDIA_CONCURRENCY : 1;
  for (let i = 0; i < pollers; i++) await work(name, (data, attempt) => handler(data, ctx, attempt));
}
// Demo recordings (the invented scenario) are not a production job: registered only with demo data on.
if (options.DEMO_DATA) {
  const { registerDemoRecordingJob } = await import('./scripts/demo/demo-recording-job');
  await registerDemoRecordingJob(boss, ctx, work);
}

const sweep = async () => {
  const recovered = await recoverLostSteps(deps, staleSeconds, {
    hasPending: (job, recordingId) => hasPendingRecordingJob(boss, job, recordingId),
    send: async (job: JobName, recordingId, key) => {
      await sendJob(boss, job, { recordingId }, key);
    },
  });
  for (const r of recovered) console.log(`recovering ${r.recordingId} from its ${r.step} step (${r.why})`);
};
await sweep();
await queueMissingAudioEvents();
const sweeper = setInterval(() => void sweep().catch((e) => console.error('recovery sweep failed:', e)), Math.min(30, staleSeconds / 2) * 1000);
await boss.schedule('uploads.cleanup', '17 * * * *', {});
await boss.schedule('lessons.publish-due', '* * * * *', {});
await boss.schedule('mail.trial-reminders', '41 * * * *', {});

console.log(`worker ready (${JOB_NAMES.join(', ')}${options.DEMO_DATA ? ', demo recordings' : ''}), scratch ${workDir}`);

/**
 * One-off catch-up: ready recordings from before "Mark it for me" (or heard by an older analyser)
 * get their audio events. The key makes several workers starting together queue each once.
 */
async function queueMissingAudioEvents(): Promise<void> {
  const missing = await recordingsWithoutEvents(deps.db);
  for (const r of missing) await sendJob(boss, 'recording.audio-events', { recordingId: r.id }, `recording.audio-events:${r.id}`);
  if (missing.length > 0) console.log(`queued audio events for ${missing.length} earlier recordings`);
}

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
