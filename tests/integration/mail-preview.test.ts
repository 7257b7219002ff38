// The owner's captured-mail page: lists what the SMTP fake stored and shows both parts, only
// when ROUNDMARK_MAIL_PREVIEW=1 (development and tests); a production server without the flag
// answers 404.
import { spawn } from 'node:child_process';
import { createServer } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { ApiClient, DEMO, signedIn } from '../helpers/api-client';
import { waitForMessage } from '../helpers/mail-box';
import { serveCommand } from '../helpers/app-server';
import { freshEmail, signUpMember } from '../helpers/mail-flow';
import { createAppDeps } from '~/server/app';
import { deliver } from '~/server/mail/transport';
import { studios } from '~/db/schema';

const deps = createAppDeps(process.env.DATABASE_URL!);
let owner: ApiClient;
beforeAll(async () => {
  owner = await signedIn(DEMO.owner);
});
afterAll(() => deps.pool.end());

describe('captured mail page', () => {
  it('lists captured messages for the owner and shows the text and HTML parts', async () => {
    const m = await signUpMember('peek');
    const mail = await waitForMessage(m.email, { since: m.since });
    const list = await owner.get('/studio/mail');
    expect(list.status).toBe(200);
    const html = await list.text();
    expect(html).toContain(m.email);
    expect(html).toContain(`/studio/mail?file=${mail.entry.file}`);

    const one = await owner.get(`/studio/mail?file=${mail.entry.file}`);
    expect(one.status).toBe(200);
    const body = await one.text();
    expect(body).toContain('data-part="text"');
    expect(body).toContain('sandbox=""');
    expect(body).toContain('srcdoc=');
    expect(body).toContain('Confirm my address');
  });

  it("shows the owner only their own studio's messages, never another studio's", async () => {
    const own = (await deps.db.query.studios.findFirst({ where: eq(studios.slug, deps.studioSlug) }))!;
    const [other] = await deps.db.insert(studios).values({ slug: `mail-other-${Date.now()}`, name: 'Another Studio' }).returning();
    const since = new Date(Date.now() - 1000);
    // Two messages through the real SMTP transport into the mail fake, one per studio.
    const ownTo = freshEmail('ours');
    const otherTo = freshEmail('theirs');
    const body = { subject: 'A note', text: 'Hello', html: '<p>Hello</p>' };
    await deliver({ ...body, studio: { id: own.id, name: own.name }, to: { name: 'Ours', address: ownTo } });
    await deliver({ ...body, studio: { id: other!.id, name: other!.name }, to: { name: 'Theirs', address: otherTo } });
    const ownMail = await waitForMessage(ownTo, { since });
    const otherMail = await waitForMessage(otherTo, { since });

    const html = await (await owner.get('/studio/mail')).text();
    expect(html).toContain(ownTo);
    expect(html).not.toContain(otherTo);
    expect((await owner.get(`/studio/mail?file=${ownMail.entry.file}`)).status).toBe(200);
    // Asking for the other studio's file by name finds nothing.
    const asked = await owner.get(`/studio/mail?file=${otherMail.entry.file}`);
    expect(asked.status).toBe(404);
    expect(await asked.text()).not.toContain(otherTo);
  });

  it('is for the owner only and reads only the fake’s own files', async () => {
    expect((await (await signedIn(DEMO.coach)).get('/studio/mail')).status).toBe(403);
    expect((await (await signedIn(DEMO.member)).get('/studio/mail')).status).toBe(403);
    const visitor = await new ApiClient().get('/studio/mail');
    expect(visitor.status).toBe(302);
    expect((await owner.get('/studio/mail?file=../../package.json')).status).toBe(404);
    expect((await owner.get('/studio/mail?file=20990101T000000000Z-000001.eml')).status).toBe(404);
  });

  describe('without ROUNDMARK_MAIL_PREVIEW, as npm start runs in production', () => {
    let stop = () => {};
    let base = '';
    beforeAll(async () => {
      const port = await freePort();
      base = `http://127.0.0.1:${port}`;
      const env: NodeJS.ProcessEnv = { ...process.env, HOST: '127.0.0.1', PORT: String(port), NODE_ENV: 'production' };
      delete env.ROUNDMARK_MAIL_PREVIEW;
      const child = spawn(...serveCommand(), { env, stdio: 'ignore' });
      stop = () => child.kill('SIGTERM');
      for (let i = 0; i < 150; i++) {
        if (await fetch(`${base}/api/health`).then((r) => r.ok, () => false)) return;
        await new Promise((r) => setTimeout(r, 100));
      }
      throw new Error('second server did not start');
    });
    afterAll(() => stop());

    it('answers 404, even to the owner', async () => {
      const res = await fetch(`${base}/studio/mail`, { headers: { cookie: owner.cookie }, redirect: 'manual' });
      expect(res.status).toBe(404);
      // The same session works on that server, so the 404 is the gate, not a missing sign-in.
      expect((await fetch(`${base}/api/me`, { headers: { cookie: owner.cookie } })).status).toBe(200);
    });
  });
});

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.listen(0, '127.0.0.1', () => {
      const addr = srv.address();
      srv.close(() => (typeof addr === 'object' && addr ? resolve(addr.port) : reject(new Error('no port'))));
    });
  });
}
