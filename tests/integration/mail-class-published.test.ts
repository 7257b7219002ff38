// "New class published": queued when a class's first version is published, run by the real
// worker, delivered to the SMTP fake only for members who opted in (and confirmed their address).
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, signedIn, type ApiClient } from '../helpers/api-client';
import { listMessages, waitForMessage } from '../helpers/mail-box';
import { expectWellFormed, onlyAppLink, pathOf, postForm, signUpMember, studioName, verifiedMember } from '../helpers/mail-flow';
import { createSmallClass } from '../helpers/published-class';
import { createAppDeps } from '~/server/app';
import { sendJob, startQueue } from '~/server/queue';

const deps = createAppDeps(process.env.DATABASE_URL!);
let dir: string;
let coach: ApiClient;
let studio: string;
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'roundmark-mail-class-'));
  coach = await signedIn(DEMO.coach);
  studio = await studioName(deps);
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
  await deps.pool.end();
});

/** The mail job for a version, as pg-boss keeps it (one row per job). */
async function mailJobs(versionId: string) {
  const { rows } = await deps.pool.query<{ state: string }>(
    `select state from pgboss.job where name = 'mail.class-published' and data->>'versionId' = $1`,
    [versionId],
  );
  return rows.map((r) => r.state);
}

async function waitForJobDone(versionId: string) {
  for (let i = 0; i < 300; i++) {
    if ((await mailJobs(versionId)).includes('completed')) return;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`mail.class-published for ${versionId} did not complete: ${await mailJobs(versionId)}`);
}

async function waitForJob(id: string) {
  for (let i = 0; i < 300; i++) {
    const { rows } = await deps.pool.query<{ state: string }>(`select state from pgboss.job where id = $1`, [id]);
    if (rows[0]?.state === 'completed') return;
    if (rows[0]?.state === 'failed') throw new Error(`job ${id} failed`);
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`job ${id} did not complete`);
}

const setNewClasses = (c: ApiClient, on: boolean) => postForm(c, '/account/email-preferences', on ? { newClasses: 'on' } : {});

describe('new class published', () => {
  it('goes only to opted-in members with a confirmed address, once, for the first version only', async () => {
    const [keen, quiet, changed, unconfirmed] = await Promise.all([
      verifiedMember('keen'),
      verifiedMember('quiet'),
      verifiedMember('changed'),
      signUpMember('unconf'),
    ]);
    // Opt in through the account page's own form; one changes their mind.
    for (const m of [keen, changed, unconfirmed]) {
      const res = await setNewClasses(m.client, true);
      expect(res.status).toBe(303);
      expect(res.headers.get('location')).toBe('/account?saved=email#email-title');
    }
    await setNewClasses(changed.client, false);
    const account = await (await keen.client.get('/account')).text();
    expect(account).toMatch(/name="newClasses" checked/);
    expect(await (await quiet.client.get('/account')).text()).not.toMatch(/name="newClasses" checked/);

    const title = `Mail Check Class ${Date.now()}`;
    const cls = await createSmallClass(coach, dir, title);
    const since = new Date();
    const published = await coach.post(`/api/lessons/${cls.lessonId}/publish`, { acknowledgeWarnings: true });
    expect(published.status).toBe(201);
    const { versionId, number } = await published.json();
    expect(number).toBe(1);

    const mail = await waitForMessage(keen.email, { since, timeoutMs: 30_000, match: (e) => (e.subject ?? '').includes(title) });
    expectWellFormed(mail, keen.email, studio);
    expect(mail.parsed.subject).toBe(`New at ${studio}: ${title}`);
    expect(mail.parsed.text).toContain('Tomasz Wren just published a new class');
    const link = onlyAppLink(mail, /^\/s\/fernhill\/classes\//);
    expect(new URL(link).pathname).toBe(`/s/fernhill/classes/${cls.slug}`);
    const page = await keen.client.get(pathOf(link));
    expect(page.status).toBe(200);
    expect(await page.text()).toContain(title);
    // The way out is in the message and leads to the account page.
    expect(mail.parsed.text).toContain('/account#email-title');
    expect((await keen.client.get('/account')).status).toBe(200);

    await waitForJobDone(versionId);
    const arrived = (await listMessages()).filter((e) => (e.subject ?? '').includes(title));
    expect(arrived.flatMap((e) => e.to)).toEqual([keen.email]);

    // A republish (version 2) queues nothing and sends nothing.
    expect((await coach.post(`/api/lessons/${cls.lessonId}/unpublish`)).status).toBe(200);
    const again = await coach.post(`/api/lessons/${cls.lessonId}/publish`, { acknowledgeWarnings: true });
    const v2 = await again.json();
    expect(v2.number).toBe(2);
    expect(await mailJobs(v2.versionId)).toEqual([]);

    // Running the first version's job again (as a retry would) sends nothing new: each member once.
    const boss = await startQueue(process.env.DATABASE_URL!);
    try {
      const jobId = await sendJob(boss, 'mail.class-published', { versionId });
      await waitForJob(jobId!);
    } finally {
      await boss.stop({ graceful: false });
    }
    const { rows } = await deps.pool.query(`select count(*)::int as n from sent_notices where key like $1`, [`class-published:${versionId}:%`]);
    expect(rows[0].n).toBe(1);
    expect((await listMessages()).filter((e) => (e.subject ?? '').includes(title))).toHaveLength(1);
  });
});
