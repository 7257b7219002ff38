import { createHash } from 'node:crypto';
import { afterAll, describe, expect, it } from 'vitest';
import { eq, sql } from 'drizzle-orm';
import { ApiClient, DEMO, signedIn } from '../helpers/api-client';
import { waitForMessage } from '../helpers/mail-box';
import { postForm } from '../helpers/mail-flow';
import { createAppDeps, SIGN_IN_LIMITS } from '~/server/app';
import { sessions, users } from '~/db/schema';
import { signIn } from '~/server/services/accounts';
import { AppError } from '~/server/errors';

const deps = createAppDeps(process.env.DATABASE_URL!);
afterAll(() => deps.pool.end());

/** The session token the cookie carries. */
const tokenOf = (c: ApiClient) => c.cookie.split('=')[1]!;
/** What the database should hold for it: hex SHA-256 of the token (FIPS 180-4, computed here with node:crypto). */
const storedIdOf = (c: ApiClient) => createHash('sha256').update(tokenOf(c)).digest('hex');

const unique = () => `person-${Date.now()}-${Math.random().toString(36).slice(2, 8)}@test.example`;
const password = 'a long enough password';

describe('sign-up and sign-in', () => {
  it('signs up, then signs in, and stores an argon2id hash (OWASP: m=19456, t=2, p=1)', async () => {
    const c = new ApiClient();
    const email = unique();
    const res = await c.post('/api/auth/sign-up', { name: 'Test Person', email, password });
    expect(res.status).toBe(202);
    expect(res.headers.get('set-cookie')).toBeNull();
    expect((await c.signIn(email, password)).status).toBe(200);
    const me = await (await c.get('/api/me')).json();
    expect(me.user.email).toBe(email);
    expect(me.studio.roles).toEqual(['member']);
    const row = await deps.db.query.users.findFirst({ where: eq(users.email, email) });
    // PHC string format of argon2: $argon2id$v=19$m=19456,t=2,p=1$...
    expect(row!.passwordHash).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$/);
  });

  it('answers a sign-up with a registered address exactly as a new one, makes no second account and e-mails the owner instead', async () => {
    const email = unique();
    const since = new Date(Date.now() - 1000);
    const first = await new ApiClient().post('/api/auth/sign-up', { name: 'First Owner', email, password });
    const again = await new ApiClient().post('/api/auth/sign-up', { name: 'Someone Else', email: email.toUpperCase(), password: 'another long password' });
    const fresh = await new ApiClient().post('/api/auth/sign-up', { name: 'New Person', email: unique(), password });
    for (const res of [first, again, fresh]) {
      expect(res.status).toBe(202);
      expect(res.headers.get('set-cookie')).toBeNull(); // no session either way
    }
    const [a, b, c] = await Promise.all([first.text(), again.text(), fresh.text()]);
    expect(b).toBe(a);
    expect(c).toBe(a);
    const rows = await deps.db.select().from(users).where(sql`lower(${users.email}) = ${email}`);
    expect(rows.map((r) => r.name)).toEqual(['First Owner']);
    // The owner hears about it through the local mail fake, with a way in.
    const mail = await waitForMessage(email, { since, match: (e) => /tried to create/i.test(e.subject ?? '') });
    expect(mail.parsed.text).toContain('/sign-in');
    expect(mail.parsed.text).toContain('/forgot-password');
    // The sign-up form says the same for both.
    const form = (address: string) => postForm(new ApiClient(), '/sign-up?_action=signUp', { name: 'Form Person', email: address, password });
    const said = (html: string) => /role="status"[^>]*>([^<]+)</.exec(html)?.[1];
    const [known, unknown] = await Promise.all([form(email), form(unique())]);
    expect(known.status).toBe(unknown.status);
    expect(said(await known.text())).toBe(said(await unknown.text()));
  });

  it('names each bad field on sign-up', async () => {
    const res = await new ApiClient().post('/api/auth/sign-up', { name: '', email: 'not-an-email', password: 'short' });
    expect(res.status).toBe(400);
    const { error } = await res.json();
    expect(error.code).toBe('invalid_input');
    expect(Object.keys(error.fields).sort()).toEqual(['email', 'name', 'password']);
  });

  it('gives a new session on every sign-in (OWASP ASVS 4.0.3, 3.2.1) with an HttpOnly, SameSite cookie', async () => {
    const a = new ApiClient();
    const first = await a.signIn(DEMO.coach);
    const cookieHeader = first.headers.getSetCookie().join('\n');
    expect(cookieHeader).toMatch(/HttpOnly/i); // ASVS 3.4.2
    expect(cookieHeader).toMatch(/SameSite=Lax/i); // ASVS 3.4.3
    const firstCookie = a.cookie;
    await a.signIn(DEMO.coach);
    expect(a.cookie).not.toBe(firstCookie);
    // Session tokens carry at least 64 bits of entropy (ASVS 3.2.2): 40 base32 chars = 200 bits.
    expect(tokenOf(a).length).toBeGreaterThanOrEqual(13);
  });

  it('stores only the SHA-256 of the cookie token: the stored id is not the cookie and signs nobody in', async () => {
    const c = await signedIn(DEMO.coach);
    const token = tokenOf(c);
    const stored = storedIdOf(c);
    expect(stored).not.toBe(token);
    expect(await deps.db.query.sessions.findFirst({ where: eq(sessions.id, stored) })).toBeDefined();
    expect(await deps.db.query.sessions.findFirst({ where: eq(sessions.id, token) })).toBeUndefined();
    // Someone with a copy of the sessions table puts a stored id in the cookie: not signed in.
    const thief = new ApiClient();
    thief.cookie = c.cookie.replace(token, stored);
    expect((await thief.get('/api/me')).status).toBe(401);
    expect((await c.get('/api/me')).status).toBe(200);
    // Signing out removes the stored row and the token stops working.
    const cookieName = c.cookie.split('=')[0]!;
    expect((await c.post('/api/auth/sign-out')).status).toBe(200);
    expect(await deps.db.query.sessions.findFirst({ where: eq(sessions.id, stored) })).toBeUndefined();
    const again = new ApiClient();
    again.cookie = `${cookieName}=${token}`;
    expect((await again.get('/api/me')).status).toBe(401);
  });

  it('answers a wrong password with the same message as an unknown e-mail, next to the password field', async () => {
    const wrong = await new ApiClient().post('/api/auth/sign-in', { email: DEMO.member, password: 'not the password' });
    const unknown = await new ApiClient().post('/api/auth/sign-in', { email: unique(), password: 'whatever it is' });
    expect(wrong.status).toBe(400);
    expect(unknown.status).toBe(400);
    const [w, u] = [await wrong.json(), await unknown.json()];
    expect(w.error.fields.password).toBe(u.error.fields.password);
  });

  it('pauses an account after repeated failed sign-ins, even for the right password', async () => {
    const email = unique();
    await new ApiClient().signUpAndIn({ name: 'Tries', email, password });
    for (let i = 0; i < SIGN_IN_LIMITS.account.points; i++) {
      const res = await new ApiClient().post('/api/auth/sign-in', { email, password: 'wrong password ' + i });
      expect(res.status).toBe(400);
    }
    const blocked = await new ApiClient().post('/api/auth/sign-in', { email, password });
    expect(blocked.status).toBe(429);
    expect(Number(blocked.headers.get('retry-after'))).toBeGreaterThan(0);
    expect((await blocked.json()).error.message).toMatch(/Too many sign-in attempts\. Please wait \d+ minutes?/);
  });

  it('pauses an address after repeated failures across accounts', async () => {
    // 203.0.113.0/24 is TEST-NET-3, reserved for documentation (RFC 5737).
    const address = `203.0.113.${Math.floor(Math.random() * 250) + 1}`;
    for (let i = 0; i < SIGN_IN_LIMITS.address.points; i++) {
      await expect(signIn(deps, { email: unique(), password: 'nope' }, address)).rejects.toMatchObject({ code: 'invalid_input' });
    }
    const err = await signIn(deps, { email: DEMO.member, password: 'fernhill-demo-2026' }, address).catch((e) => e);
    expect(err).toBeInstanceOf(AppError);
    expect(err.code).toBe('rate_limited');
  });

  it('signs out: the old cookie no longer works', async () => {
    const c = await signedIn(DEMO.member);
    const stolen = c.cookie;
    expect((await c.post('/api/auth/sign-out')).status).toBe(200);
    const replay = new ApiClient();
    replay.cookie = stolen;
    expect((await replay.get('/api/me')).status).toBe(401);
  });

  it('signs out everywhere: every session of the person ends', async () => {
    const email = unique();
    const a = new ApiClient();
    await a.signUpAndIn({ name: 'Two devices', email, password });
    const b = new ApiClient();
    await b.signIn(email, password);
    expect((await a.post('/api/auth/sign-out?everywhere=1')).status).toBe(200);
    expect((await b.get('/api/me')).status).toBe(401);
  });

  it('refuses an expired session and blanks its cookie (ASVS 3.3.1)', async () => {
    const c = await signedIn(DEMO.editor);
    const id = storedIdOf(c);
    await deps.db.update(sessions).set({ expiresAt: sql`now() - interval '1 minute'` }).where(eq(sessions.id, id));
    const res = await c.get('/api/me');
    expect(res.status).toBe(401);
    expect(c.cookie).toBe('');
  });

  it('extends a session used in its second half', async () => {
    const c = await signedIn(DEMO.editor);
    const id = storedIdOf(c);
    await deps.db.update(sessions).set({ expiresAt: sql`now() + interval '5 days'` }).where(eq(sessions.id, id));
    expect((await c.get('/api/me')).status).toBe(200);
    const row = await deps.db.query.sessions.findFirst({ where: eq(sessions.id, id) });
    expect(row!.expiresAt.getTime()).toBeGreaterThan(Date.now() + 25 * 86400_000);
  });

  it('refuses a form post from another site (Astro origin check)', async () => {
    const res = await fetch(`${process.env.TEST_BASE_URL}/sign-in?_action=signIn`, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded', origin: 'https://elsewhere.example' },
      body: 'email=a%40b.example&password=x',
    });
    expect(res.status).toBe(403);
  });
});
