/**
 * PostgreSQL stopped and started again while the app and the worker run, with timeline saves
 * going on the whole time. During the outage every request answers 503 with a clear message
 * (no stack trace) within 10 s; afterwards the same processes serve again without a restart
 * (the pool replaces its dead connections), and no save is half-applied: the stored timeline is
 * exactly one save's, all of it. Test inputs are invented.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ApiClient, DEMO, signedIn } from '../helpers/api-client';
import { smallTimeline } from '../helpers/published-class';
import { ensureWorker, processAlive, startServices, stopService, waitUntil, workerPid } from '../helpers/local-services';

const ANSWER_BOUND_MS = 10_000; // the bound: no hang over 10 s
const CUES_PER_SAVE = 40;

let coach: ApiClient;
let member: ApiClient;
let lessonId = '';

beforeAll(async () => {
  [coach, member] = await Promise.all([signedIn(DEMO.coach), signedIn(DEMO.member)]);
  const res = await coach.post('/api/lessons', { title: `Database outage ${Date.now()}`, advertisedMinutes: 10 });
  lessonId = (await res.json()).id;
});

afterAll(async () => {
  await startServices();
});

/** A whole timeline whose every cue names the save it came from, so a mix of two saves shows. */
const taggedTimeline = (version: number, save: number) => ({
  version,
  segments: smallTimeline().segments,
  cues: Array.from({ length: CUES_PER_SAVE }, (_, i) => ({ id: `c${i}`, atSeconds: (i * 11) / CUES_PER_SAVE, kind: 'note', text: `save ${save}` })),
});

async function timed(request: () => Promise<Response>) {
  const started = Date.now();
  const res = await request();
  const text = await res.text();
  return { status: res.status, text, ms: Date.now() - started, contentType: res.headers.get('content-type') ?? '' };
}

describe('PostgreSQL restarted mid-traffic', () => {
  it('answers 503 with a clear message during the outage, recovers by itself, and applies no save by half', async () => {
    const worker = workerPid();
    let saving = true;
    let version = 0;
    let save = 0;
    const outcomes: number[] = [];
    // Saves back to back through the outage; on a stale version (a save whose answer was lost) read it again.
    const saver = (async () => {
      while (saving) {
        save++;
        const res = await coach.put(`/api/lessons/${lessonId}/timeline`, taggedTimeline(version, save)).catch(() => null);
        outcomes.push(res?.status ?? 0);
        if (res?.status === 200) version = (await res.json()).version;
        else {
          await res?.arrayBuffer();
          const current = await coach.get(`/api/lessons/${lessonId}/timeline`).catch(() => null);
          if (current?.status === 200) version = (await current.json()).version;
          else await current?.arrayBuffer();
        }
      }
    })();
    await waitUntil('a few saves before the outage', () => outcomes.filter((s) => s === 200).length >= 3, 60_000);

    try {
      await stopService('postgresql');
      const title = `Written during the outage ${Date.now()}`;
      const during = [
        await timed(() => coach.get('/api/lessons')),
        await timed(() => coach.post('/api/lessons', { title, advertisedMinutes: 10 })),
        await timed(() => member.get('/api/me')),
        await timed(() => new ApiClient().post('/api/auth/sign-in', { email: DEMO.member, password: 'not the password' })),
        await timed(() => member.get('/s/fernhill/library')),
      ];
      for (const answer of during) {
        expect(answer.status, answer.text).toBe(503);
        expect(answer.ms).toBeLessThan(ANSWER_BOUND_MS);
        expect(answer.text).toMatch(/cannot reach its database right now/);
        expect(answer.text).not.toMatch(/\n\s+at .+:\d+:\d+/); // no stack trace
      }
      expect(JSON.parse(during[0]!.text).error.code).toBe('unavailable');
      expect(during[4]!.contentType).toMatch(/text\/html/);
      const health = await timed(() => fetch(`${process.env.TEST_BASE_URL}/api/health`));
      expect(health.status).toBe(503);
      expect(JSON.parse(health.text).database).toBe('down');

      await startServices();
      // The same app process serves again once the pool has new connections (no restart by anyone).
      await waitUntil('the app to answer from the database again', async () => (await coach.get('/api/lessons').then((r) => r.status).catch(() => 0)) === 200, 60_000, 250);
      const listed = (await (await coach.get('/api/lessons')).json()).lessons as { title: string }[];
      expect(listed.some((l) => l.title === title), 'the class refused during the outage was not stored').toBe(false);
      await waitUntil('saves to succeed again', () => outcomes.slice(-3).every((s) => s === 200) && outcomes.length > 3, 60_000, 250);
    } finally {
      saving = false;
      await saver;
    }

    // Every save answered, each with success, a conflict after a lost answer, or 503: never a 500.
    expect(outcomes.filter((s) => ![200, 409, 503].includes(s))).toEqual([]);
    expect(outcomes).toContain(503);
    // The stored timeline is one save's whole timeline, never a mix of two or a part of one.
    const stored = await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json();
    const tags = new Set((stored.cues as { text: string }[]).map((c) => c.text));
    expect(stored.cues).toHaveLength(CUES_PER_SAVE);
    expect(stored.segments).toHaveLength(smallTimeline().segments.length);
    expect(tags.size).toBe(1);
    // The worker lived through it too (pg-boss reconnects); if not, start one for the next tests and fail.
    const workerSurvived = processAlive(worker);
    ensureWorker();
    expect(workerSurvived, 'the job worker exited during the database outage').toBe(true);
  }, 240_000);
});
