import { and, eq } from 'drizzle-orm';
import type Stripe from 'stripe';
import { studios, subscriptions, users, webhookEvents } from '~/db/schema';
import { SUBSCRIPTION_STATUSES } from '~/lib/api/billing-schemas';
import { webhookEventSchema } from '~/lib/billing/webhook-event-schema';
import { AppError } from '../errors';
import { accessChanged } from './media-access';
import type { BillingDeps } from '../payments/billing-deps';
import { sendPaymentFailed } from '../mail/messages';

type Tx = Parameters<Parameters<BillingDeps['db']['transaction']>[0]>[0];
type Status = (typeof SUBSCRIPTION_STATUSES)[number];
const LIVE: string[] = ['trialing', 'active', 'past_due'];

/**
 * Verifies a webhook with the SDK (signature and a 5-minute timestamp tolerance) and applies it.
 * A forged or stale signature changes nothing and answers 400.
 */
export async function receiveWebhook(deps: BillingDeps, payload: string, signature: string | null, secret: string) {
  let event: Stripe.Event;
  try {
    event = deps.stripe.webhooks.constructEvent(payload, signature ?? '', secret);
  } catch {
    throw new AppError('invalid_input', 'The webhook signature does not match, so the event was not applied.');
  }
  if (!webhookEventSchema.safeParse(event).success) {
    throw new AppError('invalid_input', 'The event is signed but does not have the shape its type promises, so it was not applied.');
  }
  return applyEvent(deps, event);
}

/**
 * Applies one event once: its id goes into webhook_events in the same transaction as the change,
 * so a repeat (the provider retries, or sends twice) finds it and does nothing. Subscription
 * events older than the last one applied to that subscription are skipped (events can arrive out
 * of order). Events for people or studios this database does not know are acknowledged and ignored.
 */
export async function applyEvent(deps: BillingDeps, event: Stripe.Event): Promise<{ applied: boolean; reason?: string }> {
  const result = await applyInTransaction(deps, event);
  // After the commit: every process drops its cached "may watch" answers for the studio.
  if (result.accessChangedIn) await accessChanged(deps, result.accessChangedIn);
  // E-mail after the change is committed, so a mail problem never undoes (or repeats) the change.
  if (result.paymentFailed) {
    await sendPaymentFailed(deps, result.paymentFailed).catch((err) => console.error('payment-failed e-mail not sent:', err));
  }
  return { applied: result.applied, ...(result.reason ? { reason: result.reason } : {}) };
}

type ApplyResult = { applied: boolean; reason?: string; paymentFailed?: { userId: string; studioId: string }; accessChangedIn?: string };

async function applyInTransaction(deps: BillingDeps, event: Stripe.Event): Promise<ApplyResult> {
  // Fetched before the transaction so no network call holds it open.
  let fetched: Stripe.Subscription | null = null;
  if (event.type === 'checkout.session.completed') {
    const session = event.data.object;
    if (session.mode === 'subscription' && session.subscription) {
      fetched = typeof session.subscription === 'string' ? await deps.stripe.subscriptions.retrieve(session.subscription) : session.subscription;
    }
  }
  return deps.db.transaction(async (tx) => {
    const [fresh] = await tx.insert(webhookEvents).values({ id: event.id, type: event.type }).onConflictDoNothing().returning({ id: webhookEvents.id });
    if (!fresh) return { applied: false, reason: 'duplicate' };
    const at = new Date(event.created * 1000);
    switch (event.type) {
      case 'checkout.session.completed': {
        if (!fetched) return { applied: false, reason: 'not a subscription checkout' };
        const session = event.data.object;
        return applySubscription(tx, fetched, at, { userId: session.client_reference_id ?? undefined, studioId: session.metadata?.studioId });
      }
      case 'customer.subscription.created':
      case 'customer.subscription.updated':
      case 'customer.subscription.deleted':
        return applySubscription(tx, event.data.object, at);
      case 'invoice.payment_failed': {
        const subId = subscriptionIdOf(event.data.object);
        if (subId) {
          const [member] = await tx
            .update(subscriptions)
            .set({ pastDueSince: new Date(), updatedAt: new Date() })
            .where(and(eq(subscriptions.providerSubscriptionId, subId), eq(subscriptions.status, 'past_due')))
            .returning({ userId: subscriptions.userId, studioId: subscriptions.studioId });
          // The grace period starts now: "may watch" must be worked out again.
          if (member) return { applied: true, paymentFailed: member, accessChangedIn: member.studioId };
        }
        return { applied: true };
      }
      case 'invoice.paid':
        // The subscription.updated event that accompanies it carries the new state.
        return { applied: true };
      default:
        return { applied: false, reason: 'event type not used' };
    }
  });
}

function subscriptionIdOf(invoice: Stripe.Invoice): string | null {
  const sub = invoice.parent?.subscription_details?.subscription;
  return typeof sub === 'string' ? sub : (sub?.id ?? null);
}

async function applySubscription(tx: Tx, sub: Stripe.Subscription, at: Date, hint: { userId?: string; studioId?: string } = {}) {
  const studioId = hint.studioId ?? sub.metadata?.studioId;
  const userId = hint.userId ?? sub.metadata?.userId;
  let [row] = await tx.select().from(subscriptions).where(eq(subscriptions.providerSubscriptionId, sub.id)).for('update');
  if (!row) {
    if (!studioId || !userId || !/^[0-9a-f-]{36}$/i.test(studioId)) return { applied: false, reason: 'no studio or member named' };
    const [known] = await tx
      .select({ id: users.id })
      .from(users)
      .innerJoin(studios, eq(studios.id, studioId))
      .where(eq(users.id, userId));
    if (!known) return { applied: false, reason: 'unknown member or studio' };
    [row] = await tx.select().from(subscriptions).where(and(eq(subscriptions.studioId, studioId), eq(subscriptions.userId, userId))).for('update');
    // A late event about an ended subscription must not replace the member's newer, running one.
    if (row?.providerSubscriptionId && row.providerSubscriptionId !== sub.id && LIVE.includes(row.status) && !LIVE.includes(sub.status)) {
      return { applied: false, reason: 'about an older subscription' };
    }
    if (row?.providerSubscriptionId && row.providerSubscriptionId !== sub.id) row = { ...row, lastEventAt: null };
  }
  if (row?.lastEventAt && at < row.lastEventAt) return { applied: false, reason: 'older than the last event applied' };

  const status = (SUBSCRIPTION_STATUSES as readonly string[]).includes(sub.status) ? (sub.status as Status) : 'incomplete';
  const item = sub.items?.data?.[0];
  const periodEnd = status === 'trialing' && sub.trial_end ? sub.trial_end : item?.current_period_end;
  const values = {
    providerCustomerId: typeof sub.customer === 'string' ? sub.customer : sub.customer.id,
    providerSubscriptionId: sub.id,
    status,
    trialEnd: sub.trial_end ? new Date(sub.trial_end * 1000) : null,
    currentPeriodEnd: periodEnd ? new Date(periodEnd * 1000) : null,
    cancelAtPeriodEnd: status !== 'canceled' && (sub.cancel_at_period_end || sub.cancel_at != null),
    pastDueSince: status === 'past_due' ? (row?.status === 'past_due' && row.pastDueSince ? row.pastDueSince : new Date()) : null,
    lastEventAt: at,
    updatedAt: new Date(),
    promoCode: sub.metadata?.promoCode || (row?.providerSubscriptionId === sub.id ? row.promoCode : null),
  };
  if (row) await tx.update(subscriptions).set(values).where(eq(subscriptions.id, row.id));
  else await tx.insert(subscriptions).values({ studioId: studioId!, userId: userId!, ...values });
  return { applied: true, accessChangedIn: row?.studioId ?? studioId! };
}

/**
 * Brings a member's row up to date from the provider (used when they come back from checkout,
 * in case the webhook is still on its way). The subscription's creation time stands in for the
 * event time, so any real event about it still applies afterwards.
 */
export async function syncMembership(deps: BillingDeps, studioId: string, userId: string): Promise<void> {
  const [row] = await deps.db.select().from(subscriptions).where(and(eq(subscriptions.studioId, studioId), eq(subscriptions.userId, userId)));
  if (!row?.providerCustomerId || LIVE.includes(row.status)) return;
  const list = await deps.stripe.subscriptions.list({ customer: row.providerCustomerId, limit: 1 });
  const sub = list.data[0];
  if (!sub || sub.id === row.providerSubscriptionId) return;
  const result = await deps.db.transaction((tx) => applySubscription(tx, sub, new Date(sub.created * 1000), { studioId, userId }));
  if (result.applied) await accessChanged(deps, studioId);
}
