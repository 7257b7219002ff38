// Password reset by e-mail: the message arrives at the SMTP fake, its link opens the reset page,
// the token works once and not after expiry, and the reset signs out every session
// (OWASP ASVS 4.0.3, 3.3.1: sessions end when they should; the token is stored hashed).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { ApiClient } from '../helpers/api-client';
import { waitForMessage } from '../helpers/mail-box';
import { expectWellFormed, freshEmail, onlyAppLink, PASSWORD, pathOf, postForm, signUpMember, studioName } from '../helpers/mail-flow';
import { createAppDeps } from '~/server/app';
import { emailTokens, sessions } from '~/db/schema';
import { hashToken } from '~/server/mail/tokens';

const deps = createAppDeps(process.env.DATABASE_URL!);
let studio: string;
beforeAll(async () => {
  studio = await studioName(deps);
});
afterAll(() => deps.pool.end());

const isReset = (e: { subject: string | null }) => /reset your/i.test(e.subject ?? '');
const NEW_PASSWORD = 'a brand new password 2';

async function requestReset(email: string) {
  const since = new Date();
  const res = await new ApiClient().post('/api/auth/forgot-password', { email });
  expect(res.status).toBe(202);
  const mail = await waitForMessage(email, { since, match: isReset });
  const link = onlyAppLink(mail, /^\/reset-password$/);
  return { mail, link, token: new URL(link).searchParams.get('token')! };
}

describe('password reset', () => {
  it('answers the same whether or not the address has an account', async () => {
    const m = await signUpMember('uma');
    const known = await new ApiClient().post('/api/auth/forgot-password', { email: m.email });
    const unknown = await new ApiClient().post('/api/auth/forgot-password', { email: freshEmail('nobody') });
    expect(known.status).toBe(unknown.status);
    expect(await known.json()).toEqual(await unknown.json());

    // The page form says the same too.
    const page = (email: string) => postForm(new ApiClient(), '/forgot-password?_action=forgotPassword', { email });
    const [a, b] = await Promise.all([page(m.email), page(freshEmail('nobody'))]);
    expect(a.status).toBe(200);
    const said = (html: string) => /role="status"[^>]*>([^<]+)</.exec(html)?.[1];
    expect(said(await a.text())).toBe(said(await b.text()));
  });

  it('does no lookup in the request: known and unknown addresses each just queue one reset job', async () => {
    const m = await signUpMember('quill');
    const nobody = freshEmail('nobody');
    for (const email of [m.email, nobody]) {
      expect((await new ApiClient().post('/api/auth/forgot-password', { email })).status).toBe(202);
    }
    // pg-boss keeps every job (queued or done) in its own schema on the app database.
    const jobs = await deps.pool.query<{ email: string }>(
      `select data->>'email' as email from pgboss.job where name = 'mail.password-reset' and data->>'email' = any($1)`,
      [[m.email, nobody]],
    );
    expect(jobs.rows.map((r) => r.email).sort()).toEqual([m.email, nobody].sort());
  });

  it('e-mails a link that opens the reset page, works once, and signs out every session', async () => {
    const m = await signUpMember('rosa');
    const phone = new ApiClient();
    expect((await phone.signIn(m.email, PASSWORD)).status).toBe(200);
    expect(await deps.db.$count(sessions, eq(sessions.userId, m.userId))).toBe(2);

    const { mail, link, token } = await requestReset(m.email);
    expectWellFormed(mail, m.email, studio);
    expect(mail.parsed.subject).toBe(`Reset your ${studio} password`);
    expect(mail.parsed.text).toContain('works once, for 60 minutes');
    expect(mail.parsed.text).toContain('signed out');
    // Stored as its SHA-256 only, expiring in an hour.
    const row = await deps.db.query.emailTokens.findFirst({ where: eq(emailTokens.tokenHash, hashToken(token)) });
    expect(row!.purpose).toBe('reset-password');
    expect(row!.expiresAt.getTime() - row!.createdAt.getTime()).toBeGreaterThan(59 * 60_000);
    expect(row!.expiresAt.getTime() - row!.createdAt.getTime()).toBeLessThanOrEqual(60 * 60_000 + 5000);

    const page = await new ApiClient().get(pathOf(link));
    expect(page.status).toBe(200);
    const html = await page.text();
    expect(html).toContain('name="newPassword"');
    expect(html).toContain('name="referrer" content="no-referrer"');

    const done = await new ApiClient().post('/api/auth/reset-password', { token, newPassword: NEW_PASSWORD });
    expect(done.status).toBe(204);
    expect((await m.client.get('/api/me')).status).toBe(401);
    expect((await phone.get('/api/me')).status).toBe(401);
    expect(await deps.db.$count(sessions, eq(sessions.userId, m.userId))).toBe(0);
    expect((await new ApiClient().signIn(m.email, PASSWORD)).status).toBe(400);
    expect((await new ApiClient().signIn(m.email, NEW_PASSWORD)).status).toBe(200);

    const twice = await new ApiClient().post('/api/auth/reset-password', { token, newPassword: 'yet another password 3' });
    expect(twice.status).toBe(400);
    const { error } = await twice.json();
    expect(error.code).toBe('invalid_input');
    expect(error.message).toMatch(/already been used/);
    const reopened = await new ApiClient().get(pathOf(link));
    expect(reopened.status).toBe(400);
    expect(await reopened.text()).not.toContain('name="newPassword"');
    expect((await new ApiClient().signIn(m.email, NEW_PASSWORD)).status).toBe(200);
  });

  it('refuses a link after its hour is up', async () => {
    const m = await signUpMember('ezra');
    const { token, link } = await requestReset(m.email);
    await deps.db
      .update(emailTokens)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(and(eq(emailTokens.tokenHash, hashToken(token))));
    const res = await new ApiClient().post('/api/auth/reset-password', { token, newPassword: NEW_PASSWORD });
    expect(res.status).toBe(400);
    expect((await res.json()).error.message).toMatch(/expired/);
    const page = await new ApiClient().get(pathOf(link));
    expect(page.status).toBe(400);
    expect(await page.text()).toContain('Ask for a new link');
    // Nothing changed: the old password still works.
    expect((await new ApiClient().signIn(m.email, PASSWORD)).status).toBe(200);
  });

  it('works through the page form as a browser submits it', async () => {
    const m = await signUpMember('pia');
    const { token } = await requestReset(m.email);
    const browser = new ApiClient();
    const short = await postForm(browser, '/reset-password?_action=resetPassword', { token, newPassword: 'short' });
    expect(short.status).toBe(400);
    expect(await short.text()).toContain('Use at least 10 characters.');
    const ok = await postForm(browser, '/reset-password?_action=resetPassword', { token, newPassword: NEW_PASSWORD });
    expect(ok.status).toBe(200);
    expect(await ok.text()).toContain('Your password is changed');
    expect((await new ApiClient().signIn(m.email, NEW_PASSWORD)).status).toBe(200);
  });

  it('refuses a made-up token and a weak password with field messages', async () => {
    const made = await new ApiClient().post('/api/auth/reset-password', { token: 'x'.repeat(43), newPassword: NEW_PASSWORD });
    expect(made.status).toBe(400);
    expect((await made.json()).error.fields.token).toMatch(/not valid/);
    const weak = await new ApiClient().post('/api/auth/reset-password', { token: 'x'.repeat(43), newPassword: 'short' });
    expect((await weak.json()).error.fields.newPassword).toBe('Use at least 10 characters.');
  });
});
