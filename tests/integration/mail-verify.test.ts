// The "confirm your e-mail" message: sent on sign-up through the real SMTP fake, parsed with
// mailparser, and its link followed against the running app.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { ApiClient } from '../helpers/api-client';
import { waitForMessage } from '../helpers/mail-box';
import { expectWellFormed, onlyAppLink, pathOf, postForm, signUpMember, studioName } from '../helpers/mail-flow';
import { createAppDeps } from '~/server/app';
import { emailTokens, users } from '~/db/schema';

const deps = createAppDeps(process.env.DATABASE_URL!);
let studio: string;
beforeAll(async () => {
  studio = await studioName(deps);
});
afterAll(() => deps.pool.end());

const isConfirm = (e: { subject: string | null }) => /confirm your e-mail/i.test(e.subject ?? '');

describe('verify e-mail address', () => {
  it('is sent on sign-up, names the studio, and its link confirms the address once', async () => {
    const m = await signUpMember('vera');
    const mail = await waitForMessage(m.email, { since: m.since, match: isConfirm });
    expectWellFormed(mail, m.email, studio);
    expect(mail.parsed.subject).toBe(`Confirm your e-mail address for ${studio}`);
    expect(mail.parsed.text).toMatch(/^Hi Vera,/);
    expect(mail.parsed.text).toContain('48 hours');
    const link = onlyAppLink(mail, /^\/verify-email$/);

    // Only the hash is stored: the token in the link is not in the table.
    const token = new URL(link).searchParams.get('token')!;
    const stored = await deps.db.select().from(emailTokens).where(eq(emailTokens.userId, m.userId));
    expect(stored).toHaveLength(1);
    expect(stored[0]!.tokenHash).toMatch(/^[0-9a-f]{64}$/);
    expect(stored[0]!.tokenHash).not.toContain(token);

    // Unconfirmed members browse freely, with a gentle banner.
    const before = await m.client.get('/s/fernhill/library');
    expect(before.status).toBe(200);
    expect(await before.text()).toContain('data-verify-banner');

    const open = await m.client.get(pathOf(link));
    expect(open.status).toBe(200);
    expect(await open.text()).toContain('you are confirmed');
    const row = await deps.db.query.users.findFirst({ where: eq(users.id, m.userId) });
    expect(row!.emailVerifiedAt).toBeInstanceOf(Date);
    expect(await (await m.client.get('/s/fernhill/library')).text()).not.toContain('data-verify-banner');

    // A second click (or a mail scanner) changes nothing and says so plainly.
    const again = await new ApiClient().get(pathOf(link));
    expect(again.status).toBe(200);
    expect(await again.text()).toContain('Already confirmed');
  });

  it('refuses a made-up or expired link', async () => {
    const bogus = await new ApiClient().get('/verify-email?token=not-a-real-token-at-all-000000');
    expect(bogus.status).toBe(400);
    expect(await bogus.text()).toContain('not valid');

    const m = await signUpMember('exa');
    const mail = await waitForMessage(m.email, { since: m.since, match: isConfirm });
    await deps.db.update(emailTokens).set({ expiresAt: new Date(Date.now() - 60_000) }).where(eq(emailTokens.userId, m.userId));
    const expired = await m.client.get(pathOf(onlyAppLink(mail)));
    expect(expired.status).toBe(400);
    expect(await expired.text()).toContain('expired');
    const row = await deps.db.query.users.findFirst({ where: eq(users.id, m.userId) });
    expect(row!.emailVerifiedAt).toBeNull();
  });

  it('sends a new link on request, and none once confirmed', async () => {
    const m = await signUpMember('remi');
    await waitForMessage(m.email, { since: m.since, match: isConfirm });
    const since = new Date();
    const res = await m.client.post('/api/auth/verify-email/resend');
    expect(res.status).toBe(202);
    expect(await res.json()).toEqual({ status: 'sent' });
    const second = await waitForMessage(m.email, { since, match: isConfirm });
    expect(await m.client.get(pathOf(onlyAppLink(second)))).toHaveProperty('status', 200);

    const after = await m.client.post('/api/auth/verify-email/resend');
    expect(after.status).toBe(200);
    expect(await after.json()).toEqual({ status: 'already-verified' });
  });

  it('limits resends to five links an hour, and asks signed-out callers to sign in', async () => {
    const m = await signUpMember('ruth');
    await waitForMessage(m.email, { since: m.since, match: isConfirm });
    const statuses: number[] = [];
    for (let i = 0; i < 5; i++) statuses.push((await m.client.post('/api/auth/verify-email/resend')).status);
    // The sign-up link counts: 4 more are sent, the 5th request is refused.
    expect(statuses).toEqual([202, 202, 202, 202, 429]);
    expect((await new ApiClient().post('/api/auth/verify-email/resend')).status).toBe(401);
  });

  it('sends a new link from the page form (the resend action), with the same limit, and sends signed-out callers to sign in', async () => {
    const m = await signUpMember('rhea');
    await waitForMessage(m.email, { since: m.since, match: isConfirm });
    const since = new Date();
    const resend = () => postForm(m.client, '/verify-email?_action=resendVerificationLink', {});
    const sent = await resend();
    expect(sent.status).toBe(200);
    expect(await sent.text()).toContain('Check your inbox');
    await waitForMessage(m.email, { since, match: isConfirm });
    const statuses = [];
    for (let i = 0; i < 4; i++) statuses.push((await resend()).status);
    // The sign-up link and the one above count: 3 more make five in the hour; the form door is refused like the JSON one.
    expect(statuses).toEqual([200, 200, 200, 429]);
    const signedOut = await postForm(new ApiClient(), '/verify-email?_action=resendVerificationLink', {});
    expect(signedOut.status).toBe(303);
    expect(signedOut.headers.get('location')).toBe('/sign-in');
  });
});
