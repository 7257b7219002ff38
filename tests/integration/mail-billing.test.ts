// Billing e-mails: the "trial ends in 2 days" reminder (a scheduled job, run here through the
// real queue and worker) goes once per subscription; the "payment failed" message that the
// payments webhook sends is checked by calling it directly. Both link to the account page.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import type PgBoss from 'pg-boss';
import { ApiClient } from '../helpers/api-client';
import { listMessages, waitForMessage } from '../helpers/mail-box';
import { expectWellFormed, onlyAppLink, pathOf, signUpMember, studioName } from '../helpers/mail-flow';
import { createAppDeps } from '~/server/app';
import { billingSettings, sentNotices, studios, subscriptions } from '~/db/schema';
import { sendJob, startQueue } from '~/server/queue';
import { sendPaymentFailed } from '~/server/mail/messages';

const deps = createAppDeps(process.env.DATABASE_URL!);
let studio: { id: string; name: string };
let boss: PgBoss;
beforeAll(async () => {
  const name = await studioName(deps);
  const row = await deps.db.query.studios.findFirst({ where: eq(studios.slug, deps.studioSlug) });
  studio = { id: row!.id, name };
  boss = await startQueue(process.env.DATABASE_URL!);
});
afterAll(async () => {
  await boss.stop({ graceful: false });
  await deps.pool.end();
});

const HOUR = 3_600_000;

/** Runs the scheduled job once through the queue and waits for the worker to finish it. */
async function runTrialReminders() {
  const id = await sendJob(boss, 'mail.trial-reminders', {});
  for (let i = 0; i < 300; i++) {
    const { rows } = await deps.pool.query<{ state: string }>('select state from pgboss.job where id = $1', [id]);
    if (rows[0]?.state === 'completed') return;
    if (rows[0]?.state === 'failed') throw new Error('mail.trial-reminders failed (see test-results/worker.log)');
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error('mail.trial-reminders did not complete');
}

async function memberWithSubscription(who: string, sub: { status: 'trialing' | 'active'; trialEndInHours: number; cancelAtPeriodEnd?: boolean }) {
  const m = await signUpMember(who);
  const trialEnd = new Date(Date.now() + sub.trialEndInHours * HOUR);
  const [row] = await deps.db
    .insert(subscriptions)
    .values({ studioId: studio.id, userId: m.userId, status: sub.status, trialEnd, currentPeriodEnd: trialEnd, cancelAtPeriodEnd: sub.cancelAtPeriodEnd ?? false })
    .returning();
  return { ...m, subscriptionId: row!.id, trialEnd };
}

const isTrial = (e: { subject: string | null }) => /trial ends/.test(e.subject ?? '');

describe('trial ends in 2 days', () => {
  it('reminds each trialing member once, only within two days of the trial end', async () => {
    const soon = await memberWithSubscription('soon', { status: 'trialing', trialEndInHours: 36 });
    const leaving = await memberWithSubscription('leaving', { status: 'trialing', trialEndInHours: 20, cancelAtPeriodEnd: true });
    const later = await memberWithSubscription('later', { status: 'trialing', trialEndInHours: 5 * 24 });
    const paying = await memberWithSubscription('paying', { status: 'active', trialEndInHours: 24 });

    await runTrialReminders();
    await runTrialReminders();

    const mail = await waitForMessage(soon.email, { since: soon.since, match: isTrial });
    expectWellFormed(mail, soon.email, studio.name);
    expect(mail.parsed.subject).toBe(`Your ${studio.name} trial ends in 2 days`);
    expect(mail.parsed.text).toContain('your membership carries on');
    const settings = await deps.db.query.billingSettings.findFirst({ where: eq(billingSettings.studioId, studio.id) });
    if (settings) expect(mail.parsed.text).toContain((settings.monthlyPriceMinor / 100).toFixed(2));
    const link = onlyAppLink(mail, /^\/account$/);
    expect((await soon.client.get(pathOf(link))).status).toBe(200);

    const leavingMail = await waitForMessage(leaving.email, { since: leaving.since, match: isTrial });
    expect(leavingMail.parsed.subject).toBe(`Your ${studio.name} trial ends tomorrow`);
    expect(leavingMail.parsed.text).toContain('You have chosen not to continue');

    const all = await listMessages();
    const count = (email: string) => all.filter((e) => e.to.includes(email) && isTrial(e)).length;
    expect(count(soon.email)).toBe(1);
    expect(count(leaving.email)).toBe(1);
    expect(count(later.email)).toBe(0);
    expect(count(paying.email)).toBe(0);
    expect(await deps.db.query.sentNotices.findFirst({ where: eq(sentNotices.key, `trial-ending:${soon.subscriptionId}`) })).toBeTruthy();
  });
});

describe('payment failed', () => {
  it('tells the member, names the studio, and links to the account page', async () => {
    const m = await signUpMember('payer');
    const since = new Date();
    await sendPaymentFailed(deps, { userId: m.userId, studioId: studio.id });
    const mail = await waitForMessage(m.email, { since, match: (e) => /payment/.test(e.subject ?? '') });
    expectWellFormed(mail, m.email, studio.name);
    expect(mail.parsed.subject).toBe(`We could not take your ${studio.name} payment`);
    expect(mail.parsed.text).toMatch(/^Hi Payer,/);
    expect(mail.parsed.text).toContain('did not go through');
    const settings = await deps.db.query.billingSettings.findFirst({ where: eq(billingSettings.studioId, studio.id) });
    if (settings?.pastDueGraceDays) expect(mail.parsed.text).toContain(`keep training for ${settings.pastDueGraceDays} more day`);

    const link = onlyAppLink(mail, /^\/account$/);
    expect((await m.client.get(pathOf(link))).status).toBe(200);
    // Signed out, the link asks to sign in first.
    const signedOut = await new ApiClient().get(pathOf(link));
    expect(signedOut.status).toBe(302);
    expect(signedOut.headers.get('location')).toBe('/sign-in?next=%2Faccount'); // back to the account page after signing in
  });
});
