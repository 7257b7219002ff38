/**
 * Entitlement follows the subscription: trialing -> active -> (payment failed, within grace) ->
 * active -> cancelled at period end (still watching) -> ended (no access). Each step is checked
 * on the class page (player or offer), on a media URL of the class, and on a progress report.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { DEMO, signedIn, type ApiClient } from '../helpers/api-client';
import { createSmallClass } from '../helpers/published-class';
import { advance, newMember, registerWebhook, subscribe, testStripe, waitForMembership } from '../helpers/payments';

let dir: string;
let cls: { lessonId: string; slug: string; recordingId: string };
let member: ApiClient;
let subId: string;

beforeAll(async () => {
  await registerWebhook(testStripe());
  dir = await mkdtemp(join(tmpdir(), 'roundmark-entitlement-'));
  const coach = await signedIn(DEMO.coach);
  cls = await createSmallClass(coach, dir, `Entitlement check ${Date.now()}`);
  const pub = await coach.post(`/api/lessons/${cls.lessonId}/publish`, { acknowledgeWarnings: true });
  if (pub.status !== 201) throw new Error(`publish: ${pub.status} ${await pub.text()}`);
  ({ client: member } = await newMember('entitlement'));
});
afterAll(() => rm(dir, { recursive: true, force: true }));

/** What the member gets right now: player on the page, the playlist, and a progress report. */
async function access(c: ApiClient) {
  const html = await (await c.get(`/s/fernhill/classes/${cls.slug}`)).text();
  const media = await c.get(`/media/${cls.recordingId}/hls/master.m3u8`);
  await media.arrayBuffer();
  const poster = await c.get(`/media/${cls.recordingId}/poster.jpg`);
  await poster.arrayBuffer();
  const progress = await c.post(`/api/lessons/${cls.lessonId}/progress`, { positionSeconds: 1, watched: [[0, 1]], event: 'progress' });
  const body = await progress.json();
  return {
    player: html.includes(`/media/${cls.recordingId}/hls/master.m3u8`),
    offer: html.includes('data-testid="membership-offer"'),
    media: media.status,
    poster: poster.status,
    progress: progress.status,
    progressMessage: body.error?.message as string | undefined,
  };
}
// The poster shows in the library to every member, watching or not (browsing is free); the app
// answers it with a redirect to a signed storage link.
const WATCHING = { player: true, offer: false, media: 200, poster: 302, progress: 200 };
const LOCKED = { player: false, offer: true, media: 404, poster: 302, progress: 403 };

describe('who may watch', () => {
  it('locks a member without a membership out of player, media and progress', async () => {
    const a = await access(member);
    expect(a).toMatchObject(LOCKED);
    expect(a.progressMessage).toMatch(/membership is not active/);
    // Staff always watch, whatever their subscription.
    expect(await access(await signedIn(DEMO.editor))).toMatchObject(WATCHING);
  });

  it('opens during the trial and when it turns active', async () => {
    subId = await subscribe(member);
    await waitForMembership(member, (m) => m.status === 'trialing', 'trialing');
    expect(await access(member)).toMatchObject(WATCHING);
    await advance(subId, 'end_trial');
    await waitForMembership(member, (m) => m.status === 'active', 'active');
    expect(await access(member)).toMatchObject(WATCHING);
  });

  it('keeps access for the grace days while a payment is past due', async () => {
    await advance(subId, 'fail_payment');
    await waitForMembership(member, (m) => m.status === 'past_due', 'past_due');
    expect(await access(member)).toMatchObject(WATCHING);
    await advance(subId, 'pay');
    await waitForMembership(member, (m) => m.status === 'active', 'active again');
  });

  it('keeps access after cancelling until the period ends, then locks', async () => {
    const res = await member.post('/api/billing/cancel');
    expect(res.status).toBe(200);
    expect(await res.json()).toMatchObject({ status: 'active', cancelAtPeriodEnd: true, entitled: true });
    expect(await access(member)).toMatchObject(WATCHING);
    const page = await (await member.get('/account')).text();
    expect(page).toContain('Resume membership');

    await advance(subId, 'renew');
    await waitForMembership(member, (m) => m.status === 'canceled', 'canceled');
    expect(await access(member)).toMatchObject(LOCKED);
    expect((await member.post('/api/billing/resume')).status).toBe(409);
  });
});
