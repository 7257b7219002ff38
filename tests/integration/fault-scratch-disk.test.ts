/**
 * The worker's scratch disk full while ffmpeg packages a recording. The worker runs with its
 * scratch folder on a tmpfs just big enough for the downloaded source (tests/helpers/scratch-disk.ts),
 * so the probe step passes and ffmpeg's packaging meets "No space left on device". Then:
 * the job fails with a clear reason in the queue's output and on the recording (no stack), pg-boss
 * schedules it again, nothing is stored for the recording's media and nothing is recorded as
 * ready; once the disk is made bigger the queue's retry of the same job finishes it.
 * The normal worker is started again afterwards. Test inputs are invented.
 */
import { ListObjectsV2Command } from '@aws-sdk/client-s3';
import { mkdtemp, readFile, rm, stat } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { createAppDeps } from '~/server/app';
import { storage } from '~/server/storage';
import { lessons, recordings } from '~/db/schema';
import { type ApiClient, DEMO, signedIn } from '../helpers/api-client';
import { makeClip } from '../helpers/media-files';
import { uploadWhole, waitForRecording } from '../helpers/upload-flow';
import { ensureWorker, processAlive, waitUntil, workerPid } from '../helpers/local-services';
import { smallScratchUnsupported, startSmallScratchWorker, type SmallScratchWorker } from '../helpers/scratch-disk';

const unsupported = await smallScratchUnsupported();
if (unsupported) console.warn(`fault-scratch-disk skipped: ${unsupported}`);

const deps = createAppDeps(process.env.DATABASE_URL!);
const { s3, bucket } = storage();
let dir: string;
let coach: ApiClient;
let small: SmallScratchWorker | undefined;

async function stopWorker(pid: number) {
  if (!processAlive(pid)) return;
  process.kill(pid, 'SIGTERM');
  await waitUntil('the worker to stop', () => !processAlive(pid), 60_000);
}

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'roundmark-scratch-full-'));
  coach = await signedIn(DEMO.coach);
});
afterAll(async () => {
  // Back to the normal worker (its own scratch folder) for the test files that follow.
  if (small) await stopWorker(small.pid);
  ensureWorker();
  await rm(dir, { recursive: true, force: true });
  await deps.pool.end();
});

const packageJobs = async (recordingId: string) =>
  (
    await deps.pool.query<{ id: string; state: string; retry_count: number; output: { name?: string; message?: string; stack?: string } | null }>(
      `select id, state, retry_count, output from pgboss.job where name = 'recording.package' and data->>'recordingId' = $1`,
      [recordingId],
    )
  ).rows;

describe.skipIf(unsupported)('scratch disk full for ffmpeg', () => {
  it('fails the packaging with a clear reason, stores nothing, and the retry finishes once there is room', async () => {
    const clip = join(dir, 'scratch-full.mp4');
    await makeClip(clip, { seconds: 12, size: '320x180' });
    const sourceBytes = (await stat(clip)).size;
    const lesson = await (await coach.post('/api/lessons', { title: `Scratch disk full ${Date.now()}`, advertisedMinutes: 1 })).json();

    // Room for the downloaded source and 96 KiB more: ffmpeg's renditions cannot fit.
    await stopWorker(workerPid());
    small = await startSmallScratchWorker(sourceBytes + 96 * 1024);
    const { recordingId } = await uploadWhole(coach, lesson.id, 'scratch-full.mp4', new Uint8Array(await readFile(clip)));

    await waitUntil('the packaging attempt to fail and be scheduled again', async () => (await packageJobs(recordingId))[0]?.state === 'retry', 180_000, 250);
    const [failed] = await packageJobs(recordingId);
    expect(failed!.retry_count).toBe(0); // pg-boss counts a retry when it starts
    expect(failed!.output?.message).toMatch(/^Not enough scratch space to package the recording: the worker's scratch folder .+ ran full \(\d+\.\d MB free of \d+\.\d MB\)/);
    expect(JSON.stringify(failed!.output)).not.toMatch(/\\n\s+at /); // a reason, not a stack trace

    // The coach sees why, and that it will be tried again; nothing counts as failed or ready.
    const shown = await (await coach.get(`/api/recordings/${recordingId}`)).json();
    expect(shown).toMatchObject({ state: 'processing', failureReason: null, playlistUrl: null });
    expect(shown.retryReason).toMatch(/ran out of scratch space \(not because of your file\)\. It will try again by itself/);

    // Nothing half-stored: no media object under the recording's prefix, no outputs or current recording in the database.
    const [row] = await deps.db.select().from(recordings).where(eq(recordings.id, recordingId));
    expect(row).toMatchObject({ state: 'processing', outputPrefix: null, renditions: null, readyAt: null });
    const stored = await s3.send(new ListObjectsV2Command({ Bucket: bucket, Prefix: row!.sourceKey.replace(/[^/]+$/, '') }));
    expect((stored.Contents ?? []).map((o) => o.Key)).toEqual([row!.sourceKey]);
    const [cls] = await deps.db.select({ current: lessons.currentRecordingId }).from(lessons).where(eq(lessons.id, lesson.id));
    expect(cls!.current).toBeNull();

    // Space back: the same worker's scratch disk grows, and the queue's own retry of the same job finishes.
    await small.resize(512 * 1024 * 1024);
    // Bring the scheduled attempt forward instead of waiting out the backoff on the clock.
    await deps.pool.query(`update pgboss.job set start_after = now() where id = $1 and state = 'retry'`, [failed!.id]);
    const ready = await waitForRecording(coach, recordingId, 240_000);
    expect(ready).toMatchObject({ state: 'ready', retryReason: null, failureReason: null });
    const jobs = await packageJobs(recordingId);
    expect(jobs.map((j) => ({ id: j.id, state: j.state }))).toEqual([{ id: failed!.id, state: 'completed' }]);
    expect(jobs[0]!.retry_count).toBeGreaterThanOrEqual(1);
    const media = await s3.send(new ListObjectsV2Command({ Bucket: bucket, Prefix: `${row!.sourceKey.replace(/[^/]+$/, '')}media/` }));
    expect((media.Contents ?? []).map((o) => o.Key!.split('/media/')[1])).toEqual(expect.arrayContaining(['hls/master.m3u8', 'poster.jpg', 'peaks.bin']));
  }, 420_000);
});
