// A class's cover, against the real app, worker, PostgreSQL, object store and ffmpeg: the default is
// the first WORK chapter's thumbnail (not the warm-up before it), a chosen chapter thumbnail, back to
// the default, an uploaded PNG (checked by its bytes, cropped to 1280 × 720, stored), and bad uploads
// refused with a clear 4xx that change nothing. The clip and pictures are invented test inputs.
import { execFile } from 'node:child_process';
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type ApiClient, DEMO, signedIn } from '../helpers/api-client';
import { ffmpeg, makeClip } from '../helpers/media-files';
import { fetchMedia } from '../helpers/media-fetch';
import { uploadWhole, waitForRecording } from '../helpers/upload-flow';

const run = promisify(execFile);
let coach: ApiClient;
let member: ApiClient;
let dir: string;
let lessonId = '';
let slug = '';
let recordingId = '';
let versionId = '';
const suffix = Date.now().toString(36);

// Warm-up 4 s, then two sets of 4 s work / 2 s rest: chapters are warm-up (1), set 1 (2), set 2 (3).
const plan = {
  blocks: [
    { kind: 'warmup', seconds: 4 },
    { kind: 'intervals', exercise: 'Cover step-up', sets: 2, workSeconds: 4, restSeconds: 2 },
  ],
  options: { dropFinalRest: false },
};
const timeline = {
  segments: [
    { id: 'wu', kind: 'warmup', startSeconds: 0, endSeconds: 4 },
    { id: 'w1', kind: 'work', startSeconds: 4, endSeconds: 8, exercise: 'Cover step-up', set: 1 },
    { id: 'r1', kind: 'rest', startSeconds: 8, endSeconds: 10, set: 1 },
    { id: 'w2', kind: 'work', startSeconds: 10, endSeconds: 14, exercise: 'Cover step-up', set: 2 },
    { id: 'r2', kind: 'rest', startSeconds: 14, endSeconds: 16, set: 2 },
  ],
  cues: [],
};

async function cover(c = coach) {
  const res = await c.get(`/api/lessons/${lessonId}/cover`);
  expect(res.status).toBe(200);
  return res.json() as Promise<{ coverUrl: string | null; chosen: boolean; chapters: { number: number; kind: string; thumbnailUrl: string }[] }>;
}

/** Width and height as ffprobe reads them (an independent reader of the stored file). */
async function dimensions(bytes: Uint8Array): Promise<string> {
  const file = join(dir, `probe-${Math.random().toString(36).slice(2)}.jpg`);
  await writeFile(file, bytes);
  const { stdout } = await run('ffprobe', ['-v', 'error', '-select_streams', 'v:0', '-show_entries', 'stream=codec_name,width,height', '-of', 'csv=p=0', file]);
  return stdout.trim();
}

beforeAll(async () => {
  [coach, member] = await Promise.all([signedIn(DEMO.coach), signedIn(DEMO.member)]);
  dir = await mkdtemp(join(tmpdir(), 'roundmark-cover-'));
  const lesson = await (await coach.post('/api/lessons', { title: `Cover class ${suffix}`, advertisedMinutes: 1 })).json();
  lessonId = lesson.id;
  slug = lesson.slug;
  expect((await coach.put(`/api/lessons/${lessonId}/plan`, { version: lesson.version, ...plan })).status).toBe(200);
  expect((await coach.put(`/api/lessons/${lessonId}/timeline`, { version: 0, ...timeline })).status).toBe(200);
  const clip = join(dir, 'class.mp4');
  await makeClip(clip, { seconds: 16, size: '320x180' });
  ({ recordingId } = await uploadWhole(coach, lessonId, 'class.mp4', new Uint8Array(await readFile(clip))));
  const ready = await waitForRecording(coach, recordingId);
  expect(ready.state).toBe('ready');
}, 240_000);
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

describe('class cover', () => {
  it('a draft has no cover and cannot choose a chapter yet; refusals say why', async () => {
    expect(await cover()).toEqual({ coverUrl: null, chosen: false, chapters: [] });
    const early = await coach.put(`/api/lessons/${lessonId}/cover`, { source: 'chapter', chapter: 1 });
    expect(early.status).toBe(409);
    expect((await early.json()).error.message).toContain('Publish it first');
  });

  it('once published, the cover is the first work chapter’s thumbnail: the library card and class page show it', async () => {
    const published = await coach.post(`/api/lessons/${lessonId}/publish`, { acknowledgeWarnings: true });
    expect(published.status).toBe(201);
    versionId = (await published.json()).versionId;
    // The worker makes the chapter pictures, then sets the default cover: wait for that state.
    const deadline = Date.now() + 120_000;
    let now = await cover();
    while (!now.coverUrl && Date.now() < deadline) {
      await new Promise((r) => setTimeout(r, 500)); // polling interval for a state
      now = await cover();
    }
    expect(now.chapters.map((c) => c.kind)).toEqual(['warmup', 'work', 'work']);
    expect(now).toMatchObject({ coverUrl: `/media/${recordingId}/chapters/${versionId}/2.jpg`, chosen: false });
    const picture = await fetchMedia(member, now.coverUrl!);
    expect(picture.status).toBe(200);
    expect(picture.headers.get('content-type')).toBe('image/jpeg');

    const library = await (await member.get(`/s/fernhill/library?q=${encodeURIComponent(`Cover class ${suffix}`)}`)).text();
    expect(library).toContain(`src="/media/${recordingId}/chapters/${versionId}/2.jpg"`);
    expect(library).not.toContain(`/media/${recordingId}/poster.jpg`);
  }, 180_000);

  it('chooses another chapter’s thumbnail, refuses a chapter the class lacks, and goes back to the default', async () => {
    const chosen = await coach.put(`/api/lessons/${lessonId}/cover`, { source: 'chapter', chapter: 3 });
    expect(chosen.status).toBe(200);
    expect(await chosen.json()).toMatchObject({ coverUrl: `/media/${recordingId}/chapters/${versionId}/3.jpg`, chosen: true });
    const page = await (await member.get(`/s/fernhill/classes/${slug}`)).text();
    expect(page).toContain(`/media/${recordingId}/chapters/${versionId}/3.jpg`);

    const missing = await coach.put(`/api/lessons/${lessonId}/cover`, { source: 'chapter', chapter: 9 });
    expect(missing.status).toBe(400);
    expect((await missing.json()).error.fields.chapter).toBe('Choose a chapter from 1 to 3.');
    expect((await cover()).coverUrl).toBe(`/media/${recordingId}/chapters/${versionId}/3.jpg`);
    expect((await member.put(`/api/lessons/${lessonId}/cover`, { source: 'default' })).status).toBe(403);

    const back = await coach.put(`/api/lessons/${lessonId}/cover`, { source: 'default' });
    expect(await back.json()).toMatchObject({ coverUrl: `/media/${recordingId}/chapters/${versionId}/2.jpg`, chosen: false });
  });

  it('takes an uploaded PNG by its bytes (whatever it is called), stores it as a 1280 × 720 JPEG and shows it', async () => {
    const png = join(dir, 'photo.png');
    await ffmpeg('-f', 'lavfi', '-i', 'testsrc=size=800x600:rate=1', '-frames:v', '1', png);
    const res = await coach.request('POST', `/api/lessons/${lessonId}/cover/upload`, new Uint8Array(await readFile(png)), { 'content-type': 'application/octet-stream' });
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.chosen).toBe(true);
    expect(body.coverUrl).toMatch(new RegExp(`^/media/${recordingId}/cover/[0-9a-f-]{36}\\.jpg$`));
    const stored = new Uint8Array(await (await fetchMedia(member, body.coverUrl)).arrayBuffer());
    expect(await dimensions(stored)).toBe('mjpeg,1280,720');
    const library = await (await member.get(`/s/fernhill/library?q=${encodeURIComponent(`Cover class ${suffix}`)}`)).text();
    expect(library).toContain(`src="${body.coverUrl}"`);
  });

  it('refuses a text file named like a picture, a broken PNG, an empty body and a file over 5 MiB; the cover stays', async () => {
    const before = (await cover()).coverUrl;
    const upload = (bytes: Uint8Array, type = 'image/png') => coach.request('POST', `/api/lessons/${lessonId}/cover/upload`, bytes, { 'content-type': type });

    const text = await upload(new TextEncoder().encode('not a picture at all'));
    expect(text.status).toBe(415);
    expect((await text.json()).error.message).toBe('That file is not a JPEG or PNG picture we can read. Choose a .jpg or .png photo and try again.');
    const png = join(dir, 'broken.png');
    await ffmpeg('-f', 'lavfi', '-i', 'testsrc=size=800x600:rate=1', '-frames:v', '1', png);
    const truncated = (await readFile(png)).subarray(0, 200); // the PNG signature and header, then nothing
    expect((await upload(new Uint8Array(truncated))).status).toBe(415);
    const gif = join(dir, 'photo.gif');
    await ffmpeg('-f', 'lavfi', '-i', 'testsrc=size=80x60:rate=1', '-frames:v', '1', gif);
    expect((await upload(new Uint8Array(await readFile(gif)), 'image/jpeg')).status).toBe(415);
    const empty = await upload(new Uint8Array());
    expect(empty.status).toBe(400);
    const big = await upload(new Uint8Array(5 * 1024 * 1024 + 1));
    expect(big.status).toBe(413);
    expect((await cover()).coverUrl).toBe(before);
  });
});
