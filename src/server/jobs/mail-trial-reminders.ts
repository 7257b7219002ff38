import { and, eq, gt, lte } from 'drizzle-orm';
import { subscriptions } from '~/db/schema';
import type { AppDeps } from '../app';
import { sendTrialEnding } from '../mail/messages';
import type { JobHandler } from './job-context';
import { sendOnce } from './sent-once';

/** How long before a trial ends the reminder goes out. */
export const TRIAL_REMINDER_DAYS = 2;

/** Trialing subscriptions whose trial ends within the next two days. */
export async function trialsEndingSoon(deps: AppDeps, now = new Date()): Promise<string[]> {
  const until = new Date(now.getTime() + TRIAL_REMINDER_DAYS * 86_400_000);
  const rows = await deps.db
    .select({ id: subscriptions.id })
    .from(subscriptions)
    .where(and(eq(subscriptions.status, 'trialing'), gt(subscriptions.trialEnd, now), lte(subscriptions.trialEnd, until)));
  return rows.map((r) => r.id);
}

/** Scheduled hourly: reminds each trialing member once, about two days before the trial ends. */
export const mailTrialReminders: JobHandler<'mail.trial-reminders'> = async (_data, ctx) => {
  const due = await trialsEndingSoon(ctx.deps);
  let sent = 0;
  let failed: unknown;
  for (const subscriptionId of due) {
    try {
      if (await sendOnce(ctx.deps, `trial-ending:${subscriptionId}`, () => sendTrialEnding(ctx.deps, { subscriptionId }))) sent++;
    } catch (err) {
      failed ??= err;
    }
  }
  if (failed) throw failed;
  return { outcome: due.length ? 'done' : 'skipped', detail: `${sent} reminders sent, ${due.length - sent} already reminded` };
};
