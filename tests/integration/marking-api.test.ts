/**
 * "Mark it for me" through the API: a generated recording (invented for the test: a short
 * intervals class with timer beeps, music and chatter, see lib/media/class-soundtrack.ts) is
 * uploaded, packaged and heard by the real worker; its events are listed a page at a time; the
 * proposal follows the true boundaries, saves through the normal timeline PUT and passes the check.
 */
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { proposalOutput, recordingEventsOutput } from '~/lib/api/marking-schemas';
import { scoreSoundtrack, type SoundtrackScore } from '~/lib/media/class-soundtrack';
import { expandPlan } from '~/lib/plan/expand-plan';
import { planSchema } from '~/lib/plan/plan-schema';
import { renderSoundtrack } from '~/server/media/render-soundtrack';
import { DEMO, signedIn, type ApiClient } from '../helpers/api-client';
import { matchedShare } from '../helpers/marking-fixtures';
import { uploadWhole, waitForRecording } from '../helpers/upload-flow';

// Warm-up 40 s, 6 sets of 20 s work / 10 s rest, cool-down 40 s: 14 parts, 15 boundaries.
const planInput = {
  blocks: [
    { kind: 'warmup', seconds: 40 },
    { kind: 'intervals', exercise: 'Jump squats', sets: 6, workSeconds: 20, restSeconds: 10 },
    { kind: 'cooldown', seconds: 40 },
  ],
};

let coach: ApiClient;
let member: ApiClient;
let dir = '';
let score: SoundtrackScore;
let lessonId = '';
let recordingId = '';

async function newClass(title: string): Promise<string> {
  const res = await coach.post('/api/lessons', { title, advertisedMinutes: 4, mediaSeconds: 300 });
  expect(res.status).toBe(201);
  return (await res.json()).id;
}

async function putPlan(id: string): Promise<void> {
  const { version } = await (await coach.get(`/api/lessons/${id}/plan`)).json();
  expect((await coach.put(`/api/lessons/${id}/plan`, { version, ...planInput })).status).toBe(200);
}

beforeAll(async () => {
  coach = await signedIn(DEMO.coach);
  member = await signedIn(DEMO.member);
  dir = await mkdtemp(join(tmpdir(), 'roundmark-marking-api-'));
  score = scoreSoundtrack(expandPlan(planSchema.parse(planInput)).segments, { signal: 'beeps', seed: 3, leadInSeconds: 8, longBreak: null });
  await renderSoundtrack(score, join(dir, 'class.mp4'), { video: { width: 320, height: 180, fps: 10 } });
  lessonId = await newClass('Mark it for me API check');
  await putPlan(lessonId);
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

describe('before a recording is ready', () => {
  it('answers 422 for a class without a plan, 409 for one without a ready recording, and checks the body', async () => {
    const planless = await newClass('No plan yet');
    const noPlan = await coach.post(`/api/lessons/${planless}/timeline/propose`, {});
    expect(noPlan.status).toBe(422);
    expect((await noPlan.json()).error.message).toMatch(/no plan/);
    const noRecording = await coach.post(`/api/lessons/${lessonId}/timeline/propose`, {});
    expect(noRecording.status).toBe(409);
    expect((await noRecording.json()).error.message).toMatch(/no ready recording/);
    expect((await coach.post(`/api/lessons/${lessonId}/timeline/propose`, { offset: 3 })).status).toBe(400);
    expect((await member.post(`/api/lessons/${lessonId}/timeline/propose`, {})).status).toBe(403);
  });
});

describe('with a generated recording', () => {
  it('hears its events, lists them a page at a time (staff only), and proposes the true boundaries', { timeout: 600_000 }, async () => {
    const { recordingId: id } = await uploadWhole(coach, lessonId, 'class.mp4', new Uint8Array(await readFile(join(dir, 'class.mp4'))));
    recordingId = id;
    expect((await waitForRecording(coach, recordingId, 480_000)).state).toBe('ready');

    // Events arrive shortly after the recording is ready; until then the proposal says so.
    let first = recordingEventsOutput.parse(await (await coach.get(`/api/recordings/${recordingId}/events?limit=5`)).json());
    for (let i = 0; !first.analyzed; i++) {
      if (i === 0) {
        const early = await coach.post(`/api/lessons/${lessonId}/timeline/propose`, {});
        expect([200, 409]).toContain(early.status);
      }
      if (i > 1200) throw new Error('the audio events did not arrive within 5 minutes');
      await new Promise((r) => setTimeout(r, 250));
      first = recordingEventsOutput.parse(await (await coach.get(`/api/recordings/${recordingId}/events?limit=5`)).json());
    }
    // 4 beeps per boundary at least, so more than one page of 5.
    expect(first.total).toBeGreaterThan(4 * score.boundaries.length);
    expect(first.events).toHaveLength(5);
    expect(first.nextOffset).toBe(5);
    const second = recordingEventsOutput.parse(await (await coach.get(`/api/recordings/${recordingId}/events?limit=5&offset=5`)).json());
    expect(second.events[0]!.atSeconds).toBeGreaterThanOrEqual(first.events[4]!.atSeconds);
    const all = recordingEventsOutput.parse(await (await coach.get(`/api/recordings/${recordingId}/events?limit=2000`)).json());
    expect(all.nextOffset).toBeNull();
    const longBeeps = all.events.filter((e) => e.kind === 'tone' && e.durationSeconds >= 0.4);
    expect(longBeeps.length).toBeGreaterThanOrEqual(score.boundaries.length - 1);
    expect((await coach.get(`/api/recordings/${recordingId}/events?limit=0`)).status).toBe(400);
    expect((await member.get(`/api/recordings/${recordingId}/events`)).status).toBe(403);
    expect((await coach.get('/api/recordings/00000000-0000-4000-8000-000000000000/events')).status).toBe(404);

    const res = await coach.post(`/api/lessons/${lessonId}/timeline/propose`, {});
    expect(res.status).toBe(200);
    const proposal = proposalOutput.parse(await res.json());
    expect(proposal.recordingId).toBe(recordingId);
    const share = matchedShare(score.boundaries, proposal.boundaries.map((b) => b.atSeconds));
    expect(share).toBeGreaterThanOrEqual(0.97);

    // Nothing was saved by proposing.
    const stored = await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json();
    expect(stored.segments).toEqual([]);
    // Accepting saves through the normal timeline PUT; the check then finds no errors.
    const put = await coach.put(`/api/lessons/${lessonId}/timeline`, { version: stored.version, segments: proposal.segments, cues: proposal.cues });
    expect(put.status).toBe(200);
    const check = await (await coach.post(`/api/lessons/${lessonId}/check`)).json();
    expect(check.findings.filter((f: { severity: string }) => f.severity === 'error')).toEqual([]);
  });
});
