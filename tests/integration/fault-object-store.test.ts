/**
 * The object store down (the local store stopped) while the app and the worker run: playlist
 * requests answer 503 with a clear message within 10 s and serve again when it returns; a
 * recording whose processing starts during the outage fails that attempt, is retried by the
 * queue (backoff from src/server/queue.ts) and becomes ready once the store is back.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createDb } from '~/server/db';
import { type ApiClient, DEMO, signedIn } from '../helpers/api-client';
import { fetchMedia } from '../helpers/media-fetch';
import { makeClip } from '../helpers/media-files';
import { createSmallClass } from '../helpers/published-class';
import { uploadWhole, waitForRecording } from '../helpers/upload-flow';
import { ensureWorker, processAlive, startServices, stopService, waitUntil, workerPid } from '../helpers/local-services';

const { pool } = createDb(process.env.DATABASE_URL!);
let dir: string;
let coach: ApiClient;
let member: ApiClient;
let cls: { lessonId: string; recordingId: string };

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'roundmark-store-down-'));
  [coach, member] = await Promise.all([signedIn(DEMO.coach), signedIn(DEMO.member)]);
  cls = await createSmallClass(coach, dir, `Store outage ${Date.now()}`);
  const pub = await coach.post(`/api/lessons/${cls.lessonId}/publish`, { acknowledgeWarnings: true });
  if (pub.status !== 201) throw new Error(`publish: ${pub.status} ${await pub.text()}`);
});
afterAll(async () => {
  await startServices();
  ensureWorker();
  await pool.end();
  await rm(dir, { recursive: true, force: true });
});

async function timedMedia(path: string) {
  const started = Date.now();
  const res = await fetchMedia(member, path);
  return { status: res.status, text: await res.text(), ms: Date.now() - started };
}

describe('object store down', () => {
  it('answers playlist requests with 503 and a clear message, and serves them again when it returns', async () => {
    const master = await timedMedia(`/media/${cls.recordingId}/hls/master.m3u8`);
    expect(master.status).toBe(200);
    const variant = master.text.split('\n').find((l) => l.trim() && !l.startsWith('#'))!.trim();
    try {
      await stopService('object-store');
      for (const path of [`/media/${cls.recordingId}/hls/master.m3u8`, `/media/${cls.recordingId}/hls/${variant}`]) {
        const answer = await timedMedia(path);
        expect(answer.status, `${path}: ${answer.text}`).toBe(503);
        expect(answer.ms).toBeLessThan(10_000);
        const error = JSON.parse(answer.text).error;
        expect(error.code).toBe('unavailable');
        expect(error.message).toMatch(/media store cannot be reached right now/);
      }
    } finally {
      await startServices();
    }
    expect((await timedMedia(`/media/${cls.recordingId}/hls/master.m3u8`)).status).toBe(200);
  });

  it('retries processing that started while the store was down, and the recording becomes ready', async () => {
    const lesson = await (await coach.post('/api/lessons', { title: `Processed after the outage ${Date.now()}`, advertisedMinutes: 1 })).json();
    const clip = join(dir, 'after-outage.mp4');
    await makeClip(clip, { seconds: 12, size: '320x180' });
    // The worker is paused while the upload completes, so the first attempt is sure to meet the outage.
    const first = workerPid();
    process.kill(first, 'SIGTERM');
    await waitUntil('the worker to stop', () => !processAlive(first), 60_000);
    let recordingId = '';
    try {
      ({ recordingId } = await uploadWhole(coach, lesson.id, 'after-outage.mp4', new Uint8Array(await readFile(clip))));
      await stopService('object-store');
      ensureWorker();
      // pg-boss records the failed attempt and schedules the next one (state "retry").
      await waitUntil(
        'the first attempt to fail and be scheduled again',
        async () => (await pool.query(`select 1 from pgboss.job where data->>'recordingId' = $1 and state = 'retry'`, [recordingId])).rowCount! > 0,
        120_000,
        250,
      );
      const job = await pool.query<{ output: unknown }>(`select output from pgboss.job where data->>'recordingId' = $1 and state = 'retry'`, [recordingId]);
      expect(JSON.stringify(job.rows[0]!.output)).toMatch(/media store cannot be reached/);
    } finally {
      await startServices();
    }
    const ready = await waitForRecording(coach, recordingId, 240_000);
    expect(ready.state).toBe('ready');
  }, 300_000);
});
