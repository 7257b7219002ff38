// "Use this frame as cover" against the real app, worker, PostgreSQL, object store and ffmpeg.
// The clip is an invented test input made here with known truth: red from 0 to 4 s, blue from 4 to
// 8 s, green from 8 to 12 s, 25 frames a second. A picture taken at a time must be that time's
// colour, 1280 × 720, stored in the object store and made the cover; a time outside the recording
// answers 400 and stores nothing; a recording whose file is gone fails with words staff can act on.
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { DeleteObjectCommand, GetObjectCommand, ListObjectsV2Command } from '@aws-sdk/client-s3';
import { type ApiClient, DEMO, signedIn } from '../helpers/api-client';
import { colourAt, makeColourClip, pictureFacts } from '../helpers/media-files';
import { uploadWhole, waitForRecording } from '../helpers/upload-flow';
import { createAppDeps } from '~/server/app';
import { testBucket, testS3 } from '../helpers/object-store';
import { coverFrames, recordings } from '~/db/schema';

const deps = createAppDeps(process.env.DATABASE_URL!);
const s3 = testS3();
const bucket = testBucket();
let coach: ApiClient;
let member: ApiClient;
let dir: string;
let lessonId = '';
let recordingId = '';
let mediaPrefix = '';
const suffix = Date.now().toString(36);

type Frame = { id: string; atSeconds: number; state: string; message: string | null; coverUrl: string | null };

/** Asks for the frame, then follows the request until the worker is done with it. */
async function frameAt(atSeconds: number): Promise<Frame> {
  const res = await coach.post(`/api/lessons/${lessonId}/cover/frame`, { atSeconds });
  expect(res.status).toBe(202);
  let frame = (await res.json()) as Frame;
  expect(frame.state).toBe('waiting');
  const deadline = Date.now() + 90_000;
  while ((frame.state === 'waiting' || frame.state === 'working') && Date.now() < deadline) {
    await new Promise((r) => setTimeout(r, 250)); // polling interval for a state
    frame = await (await coach.get(`/api/lessons/${lessonId}/cover/frame/${frame.id}`)).json();
  }
  return frame;
}

/** The stored picture's size and mean colour, read from the store by readers independent of the code under test. */
async function readPicture(key: string): Promise<{ size: string; rgb: number[] }> {
  const obj = await s3.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
  const file = join(dir, `stored-${Math.random().toString(36).slice(2)}.jpg`);
  await writeFile(file, await obj.Body!.transformToByteArray());
  return pictureFacts(file);
}

const coverObjects = async () =>
  ((await s3.send(new ListObjectsV2Command({ Bucket: bucket, Prefix: `${mediaPrefix}cover/` }))).Contents ?? []).map((o) => o.Key).sort();
const frameRows = () => deps.db.select().from(coverFrames).where(eq(coverFrames.lessonId, lessonId));

beforeAll(async () => {
  [coach, member] = await Promise.all([signedIn(DEMO.coach), signedIn(DEMO.member)]);
  dir = await mkdtemp(join(tmpdir(), 'roundmark-cover-frame-'));
  const lesson = await (await coach.post('/api/lessons', { title: `Frame cover class ${suffix}`, advertisedMinutes: 1 })).json();
  lessonId = lesson.id;
  // Before any recording there is no frame to take: 409, nothing stored.
  const early = await coach.post(`/api/lessons/${lessonId}/cover/frame`, { atSeconds: 1 });
  expect(early.status).toBe(409);
  expect((await early.json()).error.message).toContain('ready recording');
  const clip = join(dir, 'colours.mp4');
  await makeColourClip(clip);
  ({ recordingId } = await uploadWhole(coach, lessonId, 'colours.mp4', new Uint8Array(await readFile(clip))));
  expect((await waitForRecording(coach, recordingId)).state).toBe('ready');
  const [rec] = await deps.db.select().from(recordings).where(eq(recordings.id, recordingId));
  mediaPrefix = `studios/${rec!.studioId}/lessons/${lessonId}/recordings/${recordingId}/media/`;
  expect(rec!.durationSeconds).toBeCloseTo(12, 1);
}, 240_000);
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
  await deps.pool.end();
});

describe('cover from the frame at the playhead', () => {
  // Each time with the colour on screen then (the clip's known truth); 3.99 s is the last red
  // frame's moment (it starts at 3.96 s), and 11.99 s the last frame of the recording.
  for (const at of [1, 3.99, 6, 11.99]) {
    const { name, rgb } = colourAt(at);
    it(`at ${at} s takes the ${name} frame, stores it as a 1280 × 720 JPEG and makes it the cover`, async () => {
      const frame = await frameAt(at);
      expect(frame).toMatchObject({ state: 'done', message: null, coverUrl: `/media/${recordingId}/cover/${frame.id}.jpg` });
      const picture = await readPicture(`${mediaPrefix}cover/${frame.id}.jpg`);
      expect(picture.size).toBe('mjpeg,1280,720');
      // JPEG and 4:2:0 colour move pure colours a little: within 24 of 255 per channel (common practice, no source).
      picture.rgb.forEach((v, i) => expect(Math.abs(v - rgb[i]!)).toBeLessThanOrEqual(24));
      const cover = await (await coach.get(`/api/lessons/${lessonId}/cover`)).json();
      expect(cover).toMatchObject({ coverUrl: frame.coverUrl, chosen: true });
    }, 120_000);
  }

  it('refuses a time outside the recording, or no time at all, with 400 and stores nothing', async () => {
    const objects = await coverObjects();
    const rows = (await frameRows()).length;
    const cover = await (await coach.get(`/api/lessons/${lessonId}/cover`)).json();
    const atEnd = await coach.post(`/api/lessons/${lessonId}/cover/frame`, { atSeconds: 12 });
    expect(atEnd.status).toBe(400);
    const body = await atEnd.json();
    expect(body.error.message).toBe('The recording is 0:12.0 long: there is no frame at 0:12.0.');
    expect(body.error.fields.atSeconds).toBe('Choose a moment from 0:00.0 to 0:11.9.');
    for (const bad of [{ atSeconds: 60 }, { atSeconds: -1 }, { atSeconds: 'half-way' }, {}]) {
      expect((await coach.post(`/api/lessons/${lessonId}/cover/frame`, bad)).status).toBe(400);
    }
    expect((await member.post(`/api/lessons/${lessonId}/cover/frame`, { atSeconds: 1 })).status).toBe(403);
    expect((await coach.get(`/api/lessons/${lessonId}/cover/frame/not-a-request`)).status).toBe(404);
    expect(await coverObjects()).toEqual(objects);
    expect((await frameRows()).length).toBe(rows);
    expect(await (await coach.get(`/api/lessons/${lessonId}/cover`)).json()).toEqual(cover);
  });

  it('says so when the recording’s file is gone, and keeps the cover it had', async () => {
    const before = (await (await coach.get(`/api/lessons/${lessonId}/cover`)).json()).coverUrl;
    const [rec] = await deps.db.select().from(recordings).where(eq(recordings.id, recordingId));
    await s3.send(new DeleteObjectCommand({ Bucket: bucket, Key: rec!.sourceKey }));
    const frame = await frameAt(2.5);
    expect(frame).toMatchObject({ state: 'failed', coverUrl: null });
    expect(frame.message).toBe('The recording’s file is no longer in storage. Upload the recording again, or upload a picture.');
    expect((await (await coach.get(`/api/lessons/${lessonId}/cover`)).json()).coverUrl).toBe(before);
  }, 120_000);
});
