/**
 * Recordings from upload to streamable media, through the real API, the real object store
 * (presigned S3 multipart requests) and the real job worker with Debian's ffmpeg.
 */
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import HLS from 'hls-parser';
import { AbortMultipartUploadCommand, ListObjectsV2Command, ListPartsCommand } from '@aws-sdk/client-s3';
import { ApiClient, DEMO, signedIn } from '../helpers/api-client';
import { makeClip, ffmpeg } from '../helpers/media-files';
import { SignedUpload, uploadWhole, waitForRecording } from '../helpers/upload-flow';
import { sendJob, startQueue } from '~/server/queue';
import { createAppDeps } from '~/server/app';
import { testS3 } from '../helpers/object-store';
import { memberships, recordings, studios, users } from '~/db/schema';
import { decodePeaks } from '~/lib/media/peaks';
import { fetchMedia, STORE_ORIGIN } from '../helpers/media-fetch';
import { REASONS } from '~/lib/media/probe-verdict';

const deps = createAppDeps(process.env.DATABASE_URL!);
const s3 = testS3();
let dir: string;
let coach: ApiClient;
let member: ApiClient;
let lessonId = '';
const MiB = 1024 * 1024;

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'roundmark-uploads-'));
  [coach, member] = await Promise.all([signedIn(DEMO.coach), signedIn(DEMO.member)]);
  lessonId = (await (await coach.post('/api/lessons', { title: 'Upload check', advertisedMinutes: 5 })).json()).id;
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
  await deps.pool.end();
});

describe('multipart upload through signed URLs', () => {
  it('uploads three parts, resumes from the listed parts, and the recording becomes ready with HLS, poster and peaks', async () => {
    // Lossless so the 12 s clip is > 10 MiB: three parts of 5 MiB, 5 MiB and the rest.
    await makeClip(join(dir, 'class.mp4'), { seconds: 12, size: '320x180', lossless: true });
    const data = new Uint8Array(await readFile(join(dir, 'class.mp4')));
    expect(data.length).toBeGreaterThan(10 * MiB);
    const rec = await (await coach.post(`/api/lessons/${lessonId}/recordings`, { fileName: 'class.mp4', sizeBytes: data.length, contentType: 'video/mp4' })).json();
    expect(rec.state).toBe('uploading');

    const up = new SignedUpload(coach, rec.id);
    await up.create();
    const e1 = await up.putPart(1, data.subarray(0, 5 * MiB));
    const e2 = await up.putPart(2, data.subarray(5 * MiB, 10 * MiB));
    // The connection drops here; the widget asks the store which parts arrived and carries on.
    const listed = await up.listParts();
    expect(listed.parts).toEqual([{ partNumber: 1, etag: e1 }, { partNumber: 2, etag: e2 }]);
    const e3 = await up.putPart(3, data.subarray(10 * MiB));
    expect(await up.complete([...listed.parts, { partNumber: 3, etag: e3 }])).toBe(200);

    // The server chose the key under the studio and class, not the one the client proposed.
    const [row] = await deps.db.select().from(recordings).where(eq(recordings.id, rec.id));
    expect(row!.sourceKey).toMatch(new RegExp(`^studios/${row!.studioId}/lessons/${lessonId}/recordings/${rec.id}/source\\.mp4$`));

    expect((await (await coach.post(`/api/recordings/${rec.id}/complete`)).json()).state).toBe('processing');
    const ready = await waitForRecording(coach, rec.id);
    expect(ready.failureReason).toBeNull();
    expect(ready.state).toBe('ready');
    expect(ready.isCurrent).toBe(true);
    // check-values.md: ffprobe reports testsrc durations exactly; one frame (33.4 ms at 30 fps) tolerance.
    expect(Math.abs(ready.durationSeconds - 12)).toBeLessThan(0.0334);

    const master = HLS.parse(await (await coach.get(ready.playlistUrl)).text());
    expect(master.isMasterPlaylist).toBe(true);
    if (!master.isMasterPlaylist) return;
    for (const variant of master.variants) {
      expect(variant.bandwidth).toBeGreaterThan(0); // RFC 8216 §4.3.4.2: BANDWIDTH is required
      expect(variant.resolution?.height).toBeLessThanOrEqual(180); // never above the source
      const media = HLS.parse(await (await coach.get(`/media/${rec.id}/hls/${variant.uri}`)).text());
      if (media.isMasterPlaylist) throw new Error('expected a media playlist');
      expect(media.endlist).toBe(true); // RFC 8216 §4.3.3.4
      for (const seg of media.segments) expect(Math.round(seg.duration)).toBeLessThanOrEqual(media.targetDuration); // §4.3.3.1
      // Segments are signed links straight to storage: fetched without the app or its cookie.
      expect(new URL(media.segments[0]!.uri).origin).toBe(STORE_ORIGIN);
      const first = await fetch(media.segments[0]!.uri);
      expect(first.status).toBe(200);
      expect(first.headers.get('content-type')).toBe('video/mp2t');
    }
    const poster = await fetchMedia(coach, ready.posterUrl);
    expect(poster.headers.get('content-type')).toBe('image/jpeg');
    expect(Buffer.from(await poster.arrayBuffer()).subarray(0, 2)).toEqual(Buffer.from([0xff, 0xd8])); // JPEG SOI marker
    const peaks = decodePeaks(new Uint8Array(await (await fetchMedia(coach, ready.peaksUrl)).arrayBuffer()));
    expect(Math.abs(peaks.min.length - 12 * peaks.rate)).toBeLessThanOrEqual(1); // issue 4: duration × rate (±1)

    // Playback media answer a Range request with 206, as players seek with it (RFC 9110 §14).
    const ranged = await fetchMedia(coach, ready.posterUrl, { range: 'bytes=0-9' });
    expect(ranged.status).toBe(206);
    expect((await ranged.arrayBuffer()).byteLength).toBe(10);
  });

  it('aborts an upload and the store drops its parts', async () => {
    const rec = await (await coach.post(`/api/lessons/${lessonId}/recordings`, { fileName: 'dropped.mov', sizeBytes: 20 * MiB, contentType: 'video/quicktime' })).json();
    const up = new SignedUpload(coach, rec.id);
    await up.create();
    await up.putPart(1, new Uint8Array(5 * MiB));
    expect(await up.abort()).toBe(204);
    const after = await up.listParts();
    expect(after.status).toBe(404); // NoSuchUpload, as S3 answers
  });

  it('signs only the recording’s own upload: another upload id is not found', async () => {
    const rec = await (await coach.post(`/api/lessons/${lessonId}/recordings`, { fileName: 'a.mp4', sizeBytes: 6 * MiB })).json();
    const up = new SignedUpload(coach, rec.id);
    await up.create();
    await up.putPart(1, new Uint8Array(5 * MiB));
    expect((await up.sign({ method: 'PUT', uploadId: 'someone-elses-upload', partNumber: 1 })).status).toBe(404);
    // A part far beyond the announced size is refused.
    expect((await up.sign({ method: 'PUT', uploadId: up.uploadId, partNumber: 50 })).status).toBe(413);
  });
});

describe('bad input', () => {
  it.each([
    ['a wrong file type', { fileName: 'notes.txt', sizeBytes: 100, contentType: 'text/plain' }, 400, /MP4, MOV, WebM or MKV/],
    ['a zero-byte file', { fileName: 'empty.mp4', sizeBytes: 0, contentType: 'video/mp4' }, 400, /empty \(0 bytes\)/],
    ['a file over the size limit', { fileName: 'huge.mp4', sizeBytes: 9 * 1024 ** 3, contentType: 'video/mp4' }, 413, /largest recording Roundmark takes is 8\.0 GB/],
  ])('refuses %s before any upload', async (_name, body, status, message) => {
    const res = await coach.post(`/api/lessons/${lessonId}/recordings`, body);
    expect(res.status).toBe(status);
    expect((await res.json()).error.message).toMatch(message);
  });

  it.each([
    ['a text file renamed .mp4', 'notes.mp4', REASONS.notVideo],
    ['a truncated MP4', 'truncated.mp4', REASONS.truncated],
    ['an audio-only file', 'audio-only.mp4', REASONS.noVideo],
  ])('fails %s after upload with a reason the coach can act on, and offers no Retry (it would fail the same way)', async (_name, fileName, reason) => {
    await writeFile(join(dir, 'notes.mp4'), 'Warm-up 4 min, then 5 stations x 40 s.\n');
    await makeClip(join(dir, 'whole.mp4'), { seconds: 12 });
    const whole = await readFile(join(dir, 'whole.mp4'));
    await writeFile(join(dir, 'truncated.mp4'), whole.subarray(0, Math.floor(whole.length / 2)));
    await ffmpeg('-f', 'lavfi', '-i', 'sine=frequency=440:duration=12', '-c:a', 'aac', '-f', 'mp4', join(dir, 'audio-only.mp4'));
    const data = new Uint8Array(await readFile(join(dir, fileName)));
    const { recordingId } = await uploadWhole(coach, lessonId, fileName, data);
    const done = await waitForRecording(coach, recordingId);
    expect(done.state).toBe('failed');
    expect(done.failureReason).toBe(reason);
    // A failed recording never replaced the current one.
    expect(done.isCurrent).toBe(false);
    expect(done.canRetry).toBe(false);
    expect((await coach.post(`/api/recordings/${recordingId}/retry`)).status).toBe(409);
  });

  it('refuses a member (403) and hides another studio’s upload (404)', async () => {
    expect((await member.post(`/api/lessons/${lessonId}/recordings`, { fileName: 'a.mp4', sizeBytes: 10 })).status).toBe(403);
    const rec = await (await coach.post(`/api/lessons/${lessonId}/recordings`, { fileName: 'b.mp4', sizeBytes: 6 * MiB })).json();
    // A coach of another studio.
    const outsider = new ApiClient();
    const email = `outsider-${Date.now()}@test.example`;
    await outsider.signUpAndIn({ name: 'Outsider', email, password: 'a long enough password' });
    const [other] = await deps.db.insert(studios).values({ slug: `elsewhere-${Date.now()}`, name: 'Elsewhere' }).returning();
    const u = await deps.db.query.users.findFirst({ where: eq(users.email, email) });
    await deps.db.update(memberships).set({ studioId: other!.id, role: 'coach' }).where(eq(memberships.userId, u!.id));
    const res = await outsider.post(`/api/recordings/${rec.id}/sign`, { method: 'POST', key: 'x' });
    expect(res.status).toBe(404);
    expect((await outsider.get(`/api/recordings/${rec.id}`)).status).toBe(404);
  });
});

describe('a cancelled upload', () => {
  it('is cleaned up by its state, not by the words of a message', async () => {
    // Two open multipart uploads with a part each: one the coach cancels, one that failed with
    // exactly the sentence the clean-up used to look for (it must now be left alone).
    const open = async (fileName: string) => {
      const rec = await (await coach.post(`/api/lessons/${lessonId}/recordings`, { fileName, sizeBytes: 6 * MiB, contentType: 'video/mp4' })).json();
      const up = new SignedUpload(coach, rec.id);
      await up.create();
      await up.putPart(1, new Uint8Array(5 * MiB));
      return up;
    };
    const cancelled = await open('cancelled.mp4');
    const lookalike = await open('lookalike.mp4');
    // The browser never got to abort: only the server knows the upload was cancelled.
    const answer = await (await coach.post(`/api/recordings/${cancelled.recordingId}/cancel`)).json();
    expect(answer.state).toBe('cancelled');
    expect(answer.canRetry).toBe(false);
    await deps.db
      .update(recordings)
      .set({ state: 'failed', failureKind: 'refused', step: null, failureReason: 'You cancelled this upload. Add the file again to upload it.' })
      .where(eq(recordings.id, lookalike.recordingId));

    const boss = await startQueue(process.env.DATABASE_URL!);
    try {
      const jobId = await sendJob(boss, 'uploads.cleanup', {});
      for (let i = 0; ; i++) {
        const { rows } = await deps.pool.query<{ state: string }>('select state from pgboss.job where id = $1', [jobId]);
        if (rows[0]?.state === 'completed') break;
        if (rows[0]?.state === 'failed' || i > 300) throw new Error('uploads.cleanup did not complete (see test-results/worker.log)');
        await new Promise((r) => setTimeout(r, 200));
      }
    } finally {
      await boss.stop({ graceful: false });
    }
    // Asked of the store directly: signing is refused once an upload is no longer open.
    const Bucket = process.env.S3_BUCKET!;
    const parts = async (up: SignedUpload) => {
      const [r] = await deps.db.select().from(recordings).where(eq(recordings.id, up.recordingId));
      return s3.send(new ListPartsCommand({ Bucket, Key: r!.sourceKey, UploadId: up.uploadId })).then(
        (res) => res.Parts?.length ?? 0,
        (err: { name?: string }) => err.name ?? 'error',
      );
    };
    // The cancelled upload's parts are gone (S3 answers NoSuchUpload) and its id is forgotten.
    expect(await parts(cancelled)).toBe('NoSuchUpload');
    const [row] = await deps.db.select().from(recordings).where(eq(recordings.id, cancelled.recordingId));
    expect(row).toMatchObject({ state: 'cancelled', uploadId: null });
    // The failed one carrying the old sentence still has its upload: nothing selected it by text.
    expect(await parts(lookalike)).toBe(1);
    const [other] = await deps.db.select().from(recordings).where(eq(recordings.id, lookalike.recordingId));
    await s3.send(new AbortMultipartUploadCommand({ Bucket, Key: other!.sourceKey, UploadId: lookalike.uploadId }));
  });
});

describe('media access', () => {
  it('keeps a draft class’s media from members and storage keys out of URLs', async () => {
    const list = await (await coach.get(`/api/lessons/${lessonId}/recordings`)).json();
    const ready = list.recordings.find((r: { state: string }) => r.state === 'ready');
    expect(ready.playlistUrl).toBe(`/media/${ready.id}/hls/master.m3u8`);
    expect(ready.playlistUrl).not.toMatch(/studios\//);
    expect((await member.get(ready.playlistUrl)).status).toBe(404);
    expect((await new ApiClient().get(ready.playlistUrl)).status).toBe(401);
    expect((await coach.get(`/media/${ready.id}/source.mp4`)).status).toBe(404);
  });
});

describe('a worker killed while packaging', () => {
  it('is recovered by a new worker and the recording ends ready with one set of outputs', async () => {
    const { startWorker, WORKER_PID_FILE } = await import('../helpers/app-server');
    await makeClip(join(dir, 'long.mp4'), { seconds: 60, size: '1280x720' });
    const data = new Uint8Array(await readFile(join(dir, 'long.mp4')));
    const { recordingId } = await uploadWhole(coach, lessonId, 'long.mp4', data);
    await waitForRecording(coach, recordingId, 120_000, (r: { step: string | null; progress: number; state: string }) => (r.step === 'package' && r.progress > 5) || r.state !== 'processing');
    process.kill(Number(await readFile(WORKER_PID_FILE, 'utf8')), 'SIGKILL');
    startWorker();
    const ready = await waitForRecording(coach, recordingId, 240_000);
    expect(ready.state).toBe('ready');

    // Exactly the files the playlists name, plus poster and peaks: no second set.
    const [row] = await deps.db.select().from(recordings).where(eq(recordings.id, recordingId));
    const listed = await s3.send(new ListObjectsV2Command({ Bucket: process.env.S3_BUCKET!, Prefix: row!.outputPrefix! }));
    const keys = (listed.Contents ?? []).map((o) => o.Key!.slice(row!.outputPrefix!.length)).sort();
    const master = HLS.parse(await (await coach.get(ready.playlistUrl)).text());
    if (!master.isMasterPlaylist) throw new Error('expected a master playlist');
    const expected = ['hls/master.m3u8', 'peaks.bin', 'poster.jpg'];
    for (const v of master.variants) {
      expected.push(`hls/${v.uri}`);
      const media = HLS.parse(await (await coach.get(`/media/${recordingId}/hls/${v.uri}`)).text());
      if (media.isMasterPlaylist) throw new Error('expected a media playlist');
      for (const s of media.segments) expected.push(`hls/${v.uri.replace('index.m3u8', new URL(s.uri).pathname.split('/').pop()!)}`);
    }
    expect(keys).toEqual(expected.sort());
  }, 420_000); // packaging a minute of 720p twice on a busy 2-core machine: states are awaited, this only bounds it
});
