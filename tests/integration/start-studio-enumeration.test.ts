// Starting a studio as a visitor must not tell whether an e-mail address has an account: a new
// address and one with an account get the same answer (no session either way), and the owner of
// the existing account is e-mailed instead. Real app, PostgreSQL and mail fake; people invented.
import { afterAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { ApiClient } from '../helpers/api-client';
import { postForm } from '../helpers/mail-flow';
import { waitForMessage } from '../helpers/mail-box';
import { createAppDeps } from '~/server/app';
import { studios, users } from '~/db/schema';

const deps = createAppDeps(process.env.DATABASE_URL!);
const run = Date.now().toString(36);
afterAll(async () => {
  await deps.pool.end();
});

const startForm = (email: string, slug: string) => ({
  ownerName: 'Founder', email, password: 'a long enough password', name: `Studio ${slug}`, slug, timeZone: 'UTC', currency: 'eur', monthlyPrice: '12.00', trialDays: '7', accentColour: '#2E5E4E',
});
/** The page's answer paragraph and whether a session cookie came with it. */
async function answerOf(res: Response) {
  const html = await res.text();
  return { status: res.status, said: /role="status"[^>]*>([^<]*)</.exec(html)?.[1] ?? null, session: res.headers.getSetCookie().some((c) => !/=;/.test(c)) };
}

describe('start a studio with an address that already has an account', () => {
  it('answers exactly as for a new address, makes nothing, and e-mails the account’s owner', async () => {
    const since = new Date();
    const existing = `has-account-${run}@enum.example`;
    const owner = new ApiClient();
    await owner.signUpAndIn({ name: 'Has Account', email: existing, password: 'another long password' });

    const fresh = await answerOf(await postForm(new ApiClient(), '/start?_action=startStudio', startForm(`new-${run}@enum.example`, `enum-new-${run}`)));
    const taken = await answerOf(await postForm(new ApiClient(), '/start?_action=startStudio', startForm(existing, `enum-old-${run}`)));
    expect(fresh.said).toMatch(/^Thanks! Check your inbox/);
    expect(taken).toEqual(fresh);
    expect(taken.session).toBe(false);

    // The new address has its account and studio; the existing one gets no studio and no second account.
    expect(await deps.db.select().from(studios).where(eq(studios.slug, `enum-new-${run}`))).toHaveLength(1);
    expect(await deps.db.select().from(studios).where(eq(studios.slug, `enum-old-${run}`))).toHaveLength(0);
    expect(await deps.db.select().from(users).where(eq(users.email, existing))).toHaveLength(1);
    // Its owner is told, with a way to sign in and start the studio from there.
    const mail = await waitForMessage(existing, { since, match: (e) => !/confirm your e-mail/i.test(e.subject ?? '') });
    expect(mail.parsed.text ?? '').toContain('/sign-in?next=%2Fstart');
  });
});
