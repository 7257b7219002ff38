/**
 * The SMTP server down (the mail fake stopped) when a class is published: publishing still
 * succeeds, the "new class" mail job fails its attempt and is scheduled again with a delay
 * (pg-boss retry with backoff, src/server/queue.ts), and once the server is back every opted-in
 * member gets the message exactly once.
 */
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, signedIn, type ApiClient } from '../helpers/api-client';
import { listMessages, waitForMessage } from '../helpers/mail-box';
import { postForm, verifiedMember } from '../helpers/mail-flow';
import { createSmallClass } from '../helpers/published-class';
import { startServices, stopService, waitUntil } from '../helpers/local-services';
import { createAppDeps } from '~/server/app';

const deps = createAppDeps(process.env.DATABASE_URL!);
let dir: string;
let coach: ApiClient;

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'roundmark-mail-down-'));
  coach = await signedIn(DEMO.coach);
});
afterAll(async () => {
  await startServices();
  await rm(dir, { recursive: true, force: true });
  await deps.pool.end();
});

const mailJob = async (versionId: string) =>
  (
    await deps.pool.query<{ id: string; state: string; delay_seconds: number; output: unknown }>(
      `select id, state, extract(epoch from start_after - now())::float as delay_seconds, output
         from pgboss.job where name = 'mail.class-published' and data->>'versionId' = $1`,
      [versionId],
    )
  ).rows[0];

describe('SMTP server down', () => {
  it('retries the mail job with a delay and delivers each message once when the server is back', async () => {
    const members = await Promise.all([verifiedMember('outage-one'), verifiedMember('outage-two')]);
    for (const m of members) expect((await postForm(m.client, '/account/email-preferences', { newClasses: 'on' })).status).toBe(303);
    const title = `Published while mail was down ${Date.now()}`;
    const cls = await createSmallClass(coach, dir, title);
    let versionId = '';
    try {
      await stopService('mail');
      const published = await coach.post(`/api/lessons/${cls.lessonId}/publish`, { acknowledgeWarnings: true });
      expect(published.status).toBe(201);
      ({ versionId } = await published.json());
      await waitUntil('the mail job to fail once and be scheduled again', async () => (await mailJob(versionId))?.state === 'retry', 120_000, 250);
      const failed = (await mailJob(versionId))!;
      // Backoff: the next attempt waits (retryDelay 60 s, doubling); not retried in a tight loop.
      expect(failed.delay_seconds).toBeGreaterThan(20);
      expect(JSON.stringify(failed.output)).toMatch(/ECONNREFUSED|connect|SMTP|mail/i);
    } finally {
      await startServices();
    }
    // Bring the scheduled attempt forward instead of waiting out the backoff on the clock.
    await deps.pool.query(`update pgboss.job set start_after = now() where name = 'mail.class-published' and data->>'versionId' = $1 and state = 'retry'`, [versionId]);
    await waitUntil('the retried mail job to complete', async () => (await mailJob(versionId))?.state === 'completed', 120_000, 250);
    for (const m of members) await waitForMessage(m.email, { timeoutMs: 30_000, match: (e) => (e.subject ?? '').includes(title) });
    const arrived = (await listMessages()).filter((e) => (e.subject ?? '').includes(title));
    // Other opted-in members of the studio (made by other test files) get the class's mail too;
    // what must hold is that each of these members got it, and that nobody got it twice.
    const recipients = arrived.flatMap((e) => e.to);
    for (const m of members) expect(recipients.filter((to) => to === m.email), m.email).toHaveLength(1);
    expect(recipients.length, recipients.join(', ')).toBe(new Set(recipients).size);
  }, 300_000);
});
