import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { WebVTTParser } from 'webvtt-parser';
import { type ApiClient, DEMO, signedIn } from '../helpers/api-client';
import { newMember } from '../helpers/payments';
import { createSmallClass, SMALL_PLAN, smallTimeline, uploadReadyRecording } from '../helpers/published-class';

let dir: string;
let coach: ApiClient;
let editor: ApiClient;
let member: ApiClient;
let cls: { lessonId: string; slug: string; recordingId: string };

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'roundmark-captions-'));
  [coach, editor, member] = await Promise.all([signedIn(DEMO.coach), signedIn(DEMO.editor), signedIn(DEMO.member)]);
  cls = await createSmallClass(coach, dir, `Captions ${Date.now()}`); // a 12 s recording
});
afterAll(() => rm(dir, { recursive: true, force: true }));

const path = () => `/api/lessons/${cls.lessonId}/captions`;
const stored = async () => (await coach.get(path())).json() as Promise<{ version: number; language: string; label: string; cues: { startSeconds: number; endSeconds: number; text: string }[]; recordingSeconds: number | null }>;
const upload = (c: ApiClient, text: string, version: number) => c.post(`${path()}/import?version=${version}&language=en&label=English%20captions`, text);

/** Invented captions for the 12 s test class, hand-written in SubRip's usual layout (common practice, no formal spec). */
const SRT = '1\n00:00:00,500 --> 00:00:03,000\nStep up, drive through the heel.\n\n2\n00:00:04,000 --> 00:00:05,500\n[timer beeps]\n\n3\n00:00:06,000 --> 00:00:11,250\nLast set,\nkeep it steady.\n';

describe('captions of a class (staff)', () => {
  it('start empty at version 0, with the recording’s length', async () => {
    const c = await stored();
    expect(c).toMatchObject({ version: 0, cues: [] });
    expect(c.recordingSeconds).toBeGreaterThan(11.9);
  });

  it('take an SRT upload, converted to cues', async () => {
    const res = await upload(coach, SRT, 0);
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ version: 1, cues: 3 });
    expect((await stored()).cues).toEqual([
      { startSeconds: 0.5, endSeconds: 3, text: 'Step up, drive through the heel.' },
      { startSeconds: 4, endSeconds: 5.5, text: '[timer beeps]' },
      { startSeconds: 6, endSeconds: 11.25, text: 'Last set,\nkeep it steady.' },
    ]);
  });

  const tooMany = `WEBVTT\n\n${Array.from({ length: 10_001 }, (_, i) => `00:00.${String(i % 1000).padStart(3, '0')} --> 00:01.000\nx`).sort().join('\n\n')}\n`;
  it.each([
    ['an empty file', '', /The file is empty/],
    ['a file that is neither WebVTT nor SRT', 'start,end,text\n0,1,Hello\n', /not a caption file/],
    ['too many cues (10,001, invented)', tooMany, /at most 10,000 captions/],
    ['a cue past the end of the 12 s recording', 'WEBVTT\n\n00:01.000 --> 00:02.000\nok\n\n00:11.000 --> 00:13.000\ntoo late\n', /Caption 2 ends after the recording/],
    ['a control character', 'WEBVTT\n\n00:01.000 --> 00:02.000\nbell\u0007\n', /control character/],
  ])('refuse %s with a clear 400 and store nothing', async (_name, text, message) => {
    const before = await stored();
    const res = await upload(coach, text, before.version);
    expect(res.status).toBe(400);
    const { error } = await res.json();
    expect(error.code).toBe('invalid_input');
    expect(error.message).toMatch(message);
    expect(Object.values(error.fields ?? {}).join(' ')).toMatch(message);
    expect(await stored()).toEqual(before);
  });

  it('refuse a file over 1 MiB with 413 and store nothing', async () => {
    const before = await stored();
    const res = await upload(coach, `WEBVTT\n\nNOTE ${'x'.repeat(1024 * 1024)}\n`, before.version);
    expect(res.status).toBe(413);
    expect(await stored()).toEqual(before);
  });

  it('save an edited list at the field, and refuse bad fields with their path', async () => {
    const before = await stored();
    const bad = await coach.put(path(), { version: before.version, language: 'en', label: 'English captions', cues: [{ startSeconds: 2, endSeconds: 1, text: 'a --> b' }] });
    expect(bad.status).toBe(400);
    const { error } = await bad.json();
    expect(Object.keys(error.fields).sort()).toEqual(['cues.0.endSeconds', 'cues.0.text']);
    expect(await stored()).toEqual(before);
    const cues = [...before.cues];
    cues[1] = { startSeconds: 3.5, endSeconds: 5.75, text: '[timer beeps] Rest.' };
    const ok = await editor.put(path(), { version: before.version, language: 'en-GB', label: 'English (UK)', cues });
    expect(ok.status).toBe(200);
    expect(await stored()).toMatchObject({ version: before.version + 1, language: 'en-GB', label: 'English (UK)', cues });
  });

  it('refuse a stale save with 409 and the current version, changing nothing', async () => {
    const before = await stored();
    const res = await coach.put(path(), { version: before.version - 1, language: 'en', label: 'English captions', cues: [] });
    expect(res.status).toBe(409);
    expect((await res.json()).error.currentVersion).toBe(before.version);
    expect(await stored()).toEqual(before);
  });

  it('are for staff only', async () => {
    expect((await member.get(path())).status).toBe(403);
    expect((await member.put(path(), { version: 0, language: 'en', label: 'x', cues: [] })).status).toBe(403);
  });
});

describe('published captions (members)', () => {
  it('are snapshotted by the publish, served as WebVTT, and unchanged by later draft edits', async () => {
    expect((await coach.post(`/api/lessons/${cls.lessonId}/publish`, { acknowledgeWarnings: true })).status).toBe(201);
    const draft = await stored();
    const res = await member.get(`/s/fernhill/classes/${cls.slug}/captions.vtt`);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/^text\/vtt/);
    const vtt = await res.text();
    // webvtt-parser 2.2.0 follows the W3C WebVTT parsing algorithm (https://www.w3.org/TR/webvtt1/).
    const parsed = new WebVTTParser().parse(vtt);
    expect(parsed.errors).toEqual([]);
    expect(parsed.cues.map((c) => [c.startTime, c.endTime, c.text])).toEqual(draft.cues.map((c) => [c.startSeconds, c.endSeconds, c.text]));

    // Removing every caption from the draft leaves the published file as it was (immutable like the chapters)…
    expect((await coach.put(path(), { version: draft.version, language: 'en', label: 'English captions', cues: [] })).status).toBe(200);
    expect(await (await member.get(`/s/fernhill/classes/${cls.slug}/captions.vtt`)).text()).toBe(vtt);
    // …until the class is published again without them.
    expect((await coach.post(`/api/lessons/${cls.lessonId}/publish`, { acknowledgeWarnings: true })).status).toBe(201);
    expect((await member.get(`/s/fernhill/classes/${cls.slug}/captions.vtt`)).status).toBe(404);
  });

  it('remember the member’s captions choice, and refuse a bad one', async () => {
    // A fresh account of its own: the demo member's choice is left alone for the browser tests.
    const { client } = await newMember('captions-choice');
    const ok = await client.put('/api/me/player-preferences', { captionsOn: true });
    expect(ok.status).toBe(200);
    expect(await ok.json()).toEqual({ captionsOn: true });
    expect((await client.put('/api/me/player-preferences', { captionsOn: 'yes' })).status).toBe(400);
    expect(await (await client.put('/api/me/player-preferences', { captionsOn: false })).json()).toEqual({ captionsOn: false });
  });
});

describe('captions against a newer, shorter recording', () => {
  it('block the publish and list the captions past the end until they are trimmed', async () => {
    // The 12 s plan of the small class, first recorded in 20 s, then replaced by a 13 s take (generated clips).
    const lesson = await (await coach.post('/api/lessons', { title: `Captions shorter take ${Date.now()}`, advertisedMinutes: 1, impact: 'low' })).json();
    await coach.put(`/api/lessons/${lesson.id}/plan`, { version: lesson.version, ...SMALL_PLAN });
    await coach.put(`/api/lessons/${lesson.id}/timeline`, { version: 0, ...smallTimeline() });
    await uploadReadyRecording(coach, dir, lesson.id, 20);
    const captionsPath = `/api/lessons/${lesson.id}/captions`;
    // Invented captions timed against the 20 s recording.
    const cues = [
      { startSeconds: 1, endSeconds: 3, text: 'Step up.' },
      { startSeconds: 11, endSeconds: 14.5, text: 'Runs past the new end.' },
      { startSeconds: 16, endSeconds: 19, text: 'After the new end.' },
    ];
    expect((await coach.put(captionsPath, { version: 0, language: 'en', label: 'English captions', cues })).status).toBe(200);

    await uploadReadyRecording(coach, dir, lesson.id, 13);
    const draft = (await (await coach.get(captionsPath)).json()) as { version: number; cues: typeof cues; recordingSeconds: number };
    // One video frame at 30 fps of tolerance on the measured length (shared/check-values.md, 'Media measurement (ffmpeg 5.1, checked here)').
    expect(Math.abs(draft.recordingSeconds - 13)).toBeLessThan(0.034);
    expect(draft.cues).toEqual(cues); // nothing changed behind the coach's back

    // The publishing panel lists it, and the publish refuses with the same words.
    const page = await (await coach.get(`/studio/classes/${lesson.id}`)).text();
    expect(page).toContain('2 captions end after the recording');
    const refused = await coach.post(`/api/lessons/${lesson.id}/publish`, { acknowledgeWarnings: true });
    expect(refused.status).toBe(409);
    expect((await refused.json()).error.message).toMatch(/^Not published: 2 captions end after the recording \(now 0:13\.\d{3} long\)/);
    expect((await (await coach.get(`/api/lessons/${lesson.id}/versions`)).json()).versions).toEqual([]);

    // The editor's fix (trim to the recording), saved like the editor saves it, lets the publish through.
    const end = draft.recordingSeconds;
    const trimmed = [cues[0]!, { ...cues[1]!, endSeconds: end }];
    expect((await coach.put(captionsPath, { version: draft.version, language: 'en', label: 'English captions', cues: trimmed })).status).toBe(200);
    expect(await (await coach.get(`/studio/classes/${lesson.id}`)).text()).not.toContain('end after the recording');
    expect((await coach.post(`/api/lessons/${lesson.id}/publish`, { acknowledgeWarnings: true })).status).toBe(201);
    const vtt = new WebVTTParser().parse(await (await member.get(`/s/fernhill/classes/${lesson.slug}/captions.vtt`)).text());
    expect(vtt.errors).toEqual([]);
    expect(vtt.cues.map((c) => c.endTime)).toEqual([3, Math.round(end * 1000) / 1000]);
  }, 240_000);
});
