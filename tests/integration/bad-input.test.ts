/**
 * Hostile and malformed input that used to answer 500: each now gets a clear 4xx with the usual
 * error body `{ error: { code, message, fields? } }`, and nothing is stored.
 * Sources: RFC 9110 §15.5.17 and §14.4 (416 and `Content-Range: bytes *\/length`); PostgreSQL's
 * `integer` is 4 bytes, at most 2147483647, and `real` is a 4-byte float (PostgreSQL 15 docs, §8.1).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Stripe from 'stripe';
import { ApiClient, DEMO, signedIn } from '../helpers/api-client';
import { createSmallClass } from '../helpers/published-class';
import { fetchMedia } from '../helpers/media-fetch';
import { WEBHOOK_SECRET } from '../helpers/payments';

let dir: string;
let owner: ApiClient;
let coach: ApiClient;
let member: ApiClient;
let cls: { lessonId: string; slug: string; recordingId: string };

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'roundmark-bad-input-'));
  [owner, coach, member] = await Promise.all([signedIn(DEMO.owner), signedIn(DEMO.coach), signedIn(DEMO.member)]);
  cls = await createSmallClass(coach, dir, `Bad input ${Date.now()}`);
  const pub = await coach.post(`/api/lessons/${cls.lessonId}/publish`, { acknowledgeWarnings: true });
  if (pub.status !== 201) throw new Error(`publish: ${pub.status} ${await pub.text()}`);
});
afterAll(() => rm(dir, { recursive: true, force: true }));

async function expectError(res: Response, status: number) {
  expect(res.status).toBe(status);
  const body = await res.json();
  expect(body.error.code).toEqual(expect.any(String));
  expect(body.error.message).toEqual(expect.any(String));
  return body.error as { code: string; message: string; fields?: Record<string, string> };
}

describe('control characters in text fields', () => {
  const NUL = 'Squat\u0000 jumps';
  const BELL = 'Squat\u0007 jumps';
  const newDraft = async () => (await (await coach.post('/api/lessons', { title: `Draft ${Date.now()}`, advertisedMinutes: 10 })).json()) as { id: string; version: number };

  it.each([
    ['title', { title: NUL, advertisedMinutes: 10 }, 'title', /The title contains a control character/],
    ['description', { title: 'Fine', advertisedMinutes: 10, description: `Line one\nLine two${BELL}` }, 'description', /The description contains/],
    ['cautions', { title: 'Fine', advertisedMinutes: 10, cautions: NUL }, 'cautions', /The cautions text contains a control character/],
    ['equipment', { title: 'Fine', advertisedMinutes: 10, equipment: ['mat', NUL] }, 'equipment.1', /Each of the items of equipment contains/],
  ])('refuses a class whose %s holds one, naming the field', async (_what, body, field, message) => {
    const error = await expectError(await coach.post('/api/lessons', body), 400);
    expect(error.fields![field]).toMatch(message);
  });

  it('keeps tabs and line breaks in several-line fields', async () => {
    const res = await coach.post('/api/lessons', { title: 'Tabs fine', advertisedMinutes: 10, description: 'One\tTwo\r\nThree' });
    expect(res.status).toBe(201);
  });

  it('refuses one in a class update, an exercise caution, a cue text, a file name and a person’s name', async () => {
    const draft = await newDraft();
    expect((await expectError(await coach.patch(`/api/lessons/${draft.id}`, { version: draft.version, title: NUL }), 400)).fields!.title).toMatch(/title/);
    const ex = await expectError(await coach.post('/api/exercises', { name: `Lunge ${Date.now()}`, cautions: NUL }), 400);
    expect(ex.fields!.cautions).toMatch(/The cautions text contains a control character/);
    const cue = await expectError(
      await coach.put(`/api/lessons/${draft.id}/timeline`, { version: 0, segments: [], cues: [{ id: 'c1', atSeconds: 1, kind: 'form', text: NUL }] }),
      400,
    );
    expect(cue.fields!['cues.0.text']).toMatch(/The cue text contains a control character/);
    const file = await expectError(await coach.post(`/api/lessons/${draft.id}/recordings`, { fileName: 'class\u0000.mp4', sizeBytes: 1000, contentType: 'video/mp4' }), 400);
    expect(file.fields!.fileName).toMatch(/The file name contains a control character/);
    const person = await expectError(await new ApiClient().post('/api/auth/sign-up', { name: NUL, email: `nul-${Date.now()}@test.example`, password: 'a long enough password' }), 400);
    expect(person.fields!.name).toMatch(/Your name contains a control character/);
    // The library page drops a query it cannot use and lists everything, as for any other bad filter.
    const library = await member.get('/s/fernhill/library?q=squat%00');
    expect(library.status).toBe(200);
    await library.arrayBuffer();
  });
});

describe('route ids that are not UUIDs', () => {
  const BAD = ['abc', '-'.repeat(36), '0'.repeat(36), '00000000-0000-0000-0000-00000000000g'];
  const ROUTES: Array<[string, (id: string) => string, unknown?]> = [
    ['GET', (id) => `/api/lessons/${id}`],
    ['PATCH', (id) => `/api/lessons/${id}`, { version: 1, title: 'x' }],
    ['DELETE', (id) => `/api/lessons/${id}`],
    ['GET', (id) => `/api/lessons/${id}/plan`],
    ['GET', (id) => `/api/lessons/${id}/timeline`],
    ['GET', (id) => `/api/lessons/${id}/check`],
    ['GET', (id) => `/api/lessons/${id}/recordings`],
    ['GET', (id) => `/api/lessons/${id}/versions`],
    ['GET', (id) => `/api/lessons/${id}/progress`],
    ['POST', (id) => `/api/lessons/${id}/progress`, { positionSeconds: 1 }],
    ['POST', (id) => `/api/lessons/${id}/publish`, {}],
    ['POST', (id) => `/api/lessons/${id}/archive`],
    ['POST', (id) => `/api/lessons/${id}/unpublish`],
    ['GET', (id) => `/api/lessons/${id}/timeline/export?format=csv`],
    ['GET', (id) => `/api/recordings/${id}`],
    ['POST', (id) => `/api/recordings/${id}/sign`, { operation: 'create' }],
    ['POST', (id) => `/api/recordings/${id}/complete`],
    ['POST', (id) => `/api/recordings/${id}/retry`],
    ['POST', (id) => `/api/recordings/${id}/cancel`],
    ['GET', (id) => `/media/${id}/poster.jpg`],
    ['PATCH', (id) => `/api/billing/promo-codes/${id}`, { active: false }],
    ['DELETE', (id) => `/api/invitations/${id}`],
    ['GET', (id) => `/studio/classes/${id}`],
    ['GET', (id) => `/studio/classes/${id}/insights`],
  ];
  it.each(ROUTES)('%s %s answers 404 for each', async (method, path, body) => {
    for (const bad of BAD) {
      const res = await owner.request(method, path(encodeURIComponent(bad)), body);
      expect(res.status, `${method} ${path(bad)}`).toBe(404);
      if (path(bad).startsWith('/api/') || path(bad).startsWith('/media/')) expect((await res.json()).error.code).toBe('not_found');
      else await res.arrayBuffer();
    }
  });

  // Found by tests/integration/openapi-fuzz.test.ts: an id holding a quote, a backslash or an
  // encoded slash matches no route at all, and the framework answered its HTML 404 page.
  it.each(['"x"', 'a\\b', '<script>alert(1)</script>', '%00'])('an id no route can match (%s) still gets the JSON error body', async (bad) => {
    for (const path of [`/api/lessons/${encodeURIComponent(bad)}/archive`, `/api/recordings/${encodeURIComponent(bad)}/retry`, `/media/${encodeURIComponent(bad)}/poster.jpg`]) {
      const res = await owner.request(path.startsWith('/media/') ? 'GET' : 'POST', path);
      expect(res.status, path).toBe(404);
      expect(res.headers.get('content-type'), path).toMatch(/application\/json/);
      expect((await res.json()).error.code, path).toBe('not_found');
    }
  });
});

describe('numbers past their columns', () => {
  // Found by tests/integration/openapi-fuzz.test.ts (seed 20261202): PostgreSQL's 4-byte real underflows below ~1.2e-38.
  it('refuses a recording length too small for its real column instead of failing on it', async () => {
    const res = await coach.post('/api/lessons', { title: 'Tiny length', advertisedMinutes: 10, mediaSeconds: 1e-300 });
    const error = await expectError(res, 400);
    expect(error.fields!.mediaSeconds).toMatch(/at least a millisecond/);
  });

  it('refuses a class version past PostgreSQL integer (2147483647)', async () => {
    const error = await expectError(await coach.patch(`/api/lessons/${cls.lessonId}`, { version: 3_000_000_000, title: 'x' }), 400);
    expect(error.fields!.version).toMatch(/version does not exist/);
    const timeline = await expectError(await coach.put(`/api/lessons/${cls.lessonId}/timeline`, { version: 3_000_000_000, segments: [], cues: [] }), 400);
    expect(timeline.fields!.version).toBeDefined();
  });

  it('refuses a recording length too small for its 4-byte real column (1e-300), and changes nothing', async () => {
    const before = await (await coach.get(`/api/lessons/${cls.lessonId}`)).json();
    const error = await expectError(await coach.patch(`/api/lessons/${cls.lessonId}`, { version: before.version, mediaSeconds: 1e-300 }), 400);
    expect(error.fields!.mediaSeconds).toMatch(/at least a millisecond/);
    const after = await (await coach.get(`/api/lessons/${cls.lessonId}`)).json();
    expect(after).toEqual(before);
  });

  it('refuses progress positions past a day, which a 4-byte real cannot even hold at 1e300', async () => {
    for (const body of [
      { positionSeconds: 1, fromSeconds: 1e300, event: 'seek' },
      { positionSeconds: 1, watched: [[0, 1e300]] },
      { positionSeconds: 1e39 },
      // Found by tests/integration/openapi-fuzz.test.ts: too small for a 4-byte real as well.
      { positionSeconds: 1e-300 },
      { positionSeconds: 1, watched: [[0, 1e-300]] },
    ]) {
      await expectError(await member.post(`/api/lessons/${cls.lessonId}/progress`, body), 400);
    }
    // Inside a day but past the class: stored, clamped to the class's own length.
    const ok = await member.post(`/api/lessons/${cls.lessonId}/progress`, { positionSeconds: 3, fromSeconds: 80_000, event: 'seek' });
    expect(ok.status).toBe(200);
  });
});

describe('ranges on /media', () => {
  it('answers 416 with Content-Range: bytes */size for a range past the end (RFC 9110 §15.5.17)', async () => {
    const whole = await fetchMedia(coach, `/media/${cls.recordingId}/poster.jpg`);
    const size = (await whole.arrayBuffer()).byteLength;
    expect(size).toBeGreaterThan(0);
    const res = await coach.request('GET', `/media/${cls.recordingId}/poster.jpg`, undefined, { range: `bytes=${size + 10}-` });
    expect(res.status).toBe(416);
    expect(res.headers.get('content-range')).toBe(`bytes */${size}`);
    expect((await res.json()).error.code).toBe('range_not_satisfiable');
  });

  it('serves a suffix range as the last bytes, refuses a malformed one and ignores another unit (RFC 9110 §14.1.2, §14.2, §15.5.17)', async () => {
    const whole = new Uint8Array(await (await fetchMedia(coach, `/media/${cls.recordingId}/poster.jpg`)).arrayBuffer());
    const tail = await coach.request('GET', `/media/${cls.recordingId}/poster.jpg`, undefined, { range: 'bytes=-4' });
    expect(tail.status).toBe(206);
    expect(tail.headers.get('content-range')).toBe(`bytes ${whole.length - 4}-${whole.length - 1}/${whole.length}`);
    expect([...new Uint8Array(await tail.arrayBuffer())]).toEqual([...whole.slice(-4)]);
    // §15.5.17: 416 also when "the set of ranges requested has been rejected due to invalid ranges".
    const junk = await coach.request('GET', `/media/${cls.recordingId}/poster.jpg`, undefined, { range: 'bytes=abc' });
    expect(junk.status).toBe(416);
    expect(junk.headers.get('content-range')).toBe(`bytes */${whole.length}`);
    await junk.arrayBuffer();
    // §14.2: a range unit the server does not understand MUST be ignored: the whole file.
    const other = await fetchMedia(coach, `/media/${cls.recordingId}/poster.jpg`, { range: 'items=0-3' });
    expect(other.status).toBe(200);
    expect((await other.arrayBuffer()).byteLength).toBe(whole.length);
  });
});

describe('webhook events with a valid signature but a malformed shape', () => {
  const stripe = new Stripe('sk_test_unused');
  const signed = (event: unknown) => {
    const payload = JSON.stringify(event);
    return new ApiClient().request('POST', '/api/payments/webhook', payload, {
      'content-type': 'application/json',
      'stripe-signature': stripe.webhooks.generateTestHeaderString({ payload, secret: WEBHOOK_SECRET }),
    });
  };
  const created = () => Math.floor(Date.now() / 1000);

  it.each([
    ['a subscription event without its object', { id: `evt_bad_${Date.now()}_1`, type: 'customer.subscription.updated', created: created(), data: {} }],
    ['a subscription whose customer is a number', { id: `evt_bad_${Date.now()}_2`, type: 'customer.subscription.updated', created: created(), data: { object: { id: 'sub_x', status: 'active', customer: 42, items: { data: 'none' } } } }],
    ['a checkout whose created time is text', { id: `evt_bad_${Date.now()}_3`, type: 'checkout.session.completed', created: 'yesterday', data: { object: { mode: 'subscription', subscription: 'sub_x' } } }],
    ['an event without an id', { type: 'invoice.paid', created: created(), data: { object: {} } }],
  ])('refuses %s with 400', async (_what, event) => {
    const error = await expectError(await signed(event), 400);
    expect(error.message).toMatch(/does not have the shape/);
  });
});
