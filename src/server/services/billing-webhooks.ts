import { and, eq } from 'drizzle-orm';
import type Stripe from 'stripe';
import { memberships, paymentAccounts, subscriptions, webhookEvents } from '~/db/schema';
import { SUBSCRIPTION_STATUSES } from '~/lib/api/billing-schemas';
import { webhookEventSchema } from '~/lib/billing/webhook-event-schema';
import { AppError } from '../errors';
import { accessChanged } from './media-access';
import { flagsOf, onAccount, studioOfAccount } from './payment-accounts';
import type { BillingDeps } from '../payments/billing-deps';
import { sendPaymentFailed } from '../mail/messages';

type Tx = Parameters<Parameters<BillingDeps['db']['transaction']>[0]>[0];
type Status = (typeof SUBSCRIPTION_STATUSES)[number];
const LIVE: string[] = ['trialing', 'active', 'past_due'];

/** How far a signature's time may be from ours, either way (the SDK's default tolerance). */
export const WEBHOOK_TOLERANCE_SECONDS = 300;

/**
 * Verifies a webhook with the SDK (signature, and a timestamp at most 5 minutes old) and applies
 * it. The SDK accepts any timestamp in the future, so one dated ahead is refused here: a forged or
 * stale signature, either way, changes nothing and answers 400.
 */
export async function receiveWebhook(deps: BillingDeps, payload: string, signature: string | null, secrets: string | readonly string[]) {
  // The platform's endpoint and the connected accounts' endpoint each have their own secret.
  let event: Stripe.Event | null = null;
  for (const secret of new Set(typeof secrets === 'string' ? [secrets] : secrets)) {
    try {
      event = deps.stripe.webhooks.constructEvent(payload, signature ?? '', secret, WEBHOOK_TOLERANCE_SECONDS);
      break;
    } catch {
      // try the next secret
    }
  }
  if (!event) throw new AppError('invalid_input', 'The webhook signature does not match, so the event was not applied.');
  const signedAt = Number(/(?:^|,)\s*t=(\d+)/.exec(signature ?? '')?.[1]);
  if (!(signedAt <= Math.floor(Date.now() / 1000) + WEBHOOK_TOLERANCE_SECONDS)) {
    throw new AppError('invalid_input', 'The webhook signature is dated in the future, so the event was not applied.');
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
  // An event on a connected account belongs to the studio that owns that account, and only to it.
  let route: Route = { studioId: null, accountId: null };
  if (event.account) {
    const owner = await studioOfAccount(deps, event.account);
    if (!owner) {
      // Someone else's account on the same platform, or one we never stored: nothing to write.
      console.warn(`payments webhook ${event.id} (${event.type}) names account ${event.account}, which no studio here owns; acknowledged, not applied`);
      return { applied: false, reason: 'unknown account' };
    }
    route = { studioId: owner.studioId, accountId: owner.providerAccountId };
  }
  const result = await applyInTransaction(deps, event, route);
  // After the commit: every process drops its cached "may watch" answers for the studio.
  if (result.accessChangedIn) await accessChanged(deps, result.accessChangedIn);
  // E-mail after the change is committed, so a mail problem never undoes (or repeats) the change.
  if (result.paymentFailed) {
    await sendPaymentFailed(deps, result.paymentFailed).catch((err) => console.error('payment-failed e-mail not sent:', err));
  }
  return { applied: result.applied, ...(result.reason ? { reason: result.reason } : {}) };
}

type ApplyResult = { applied: boolean; reason?: string; paymentFailed?: { userId: string; studioId: string }; accessChangedIn?: string };

/** The studio and connected account an event was routed to; both null for the platform's own events. */
type Route = { studioId: string | null; accountId: string | null };

/**
 * The subscription as the provider holds it now. Events can arrive in any order and several in
 * one second, so the event's own copy may be stale; the provider's documentation advises fetching
 * the object. A subscription the provider no longer knows falls back to the event's copy; the
 * provider being unreachable answers 503, and the provider sends the event again later.
 */
async function currentSubscription(deps: BillingDeps, id: string, accountId: string | null, fallback?: Stripe.Subscription): Promise<Stripe.Subscription> {
  try {
    return await deps.stripe.subscriptions.retrieve(id, {}, onAccount(accountId));
  } catch (err) {
    const e = err as { statusCode?: number; code?: string };
    if (fallback && (e.statusCode === 404 || e.code === 'resource_missing')) return fallback;
    throw new AppError('unavailable', 'The payment service could not be reached to read the subscription; the event will be retried.');
  }
}

/** The connected account as the provider holds it now (events may arrive out of order); 503 when unreachable. */
async function currentAccount(deps: BillingDeps, id: string): Promise<Stripe.Account> {
  try {
    return await deps.stripe.accounts.retrieve(id);
  } catch {
    throw new AppError('unavailable', 'The payment service could not be reached to read the account; the event will be retried.');
  }
}

async function applyInTransaction(deps: BillingDeps, event: Stripe.Event, route: Route): Promise<ApplyResult> {
  // Fetched before the transaction so no network call holds it open.
  let fetched: Stripe.Subscription | null = null;
  let account: Stripe.Account | null = null;
  if (event.type === 'checkout.session.completed') {
    const session = event.data.object;
    if (session.mode === 'subscription' && session.subscription) {
      const sub = session.subscription;
      fetched = await currentSubscription(deps, typeof sub === 'string' ? sub : sub.id, route.accountId, typeof sub === 'string' ? undefined : sub);
    }
  }
  if (event.type.startsWith('customer.subscription.')) {
    const sub = event.data.object as Stripe.Subscription;
    fetched = await currentSubscription(deps, sub.id, route.accountId, sub);
  }
  if (event.type === 'account.updated' && route.accountId) account = await currentAccount(deps, route.accountId);
  return deps.db.transaction(async (tx) => {
    const [fresh] = await tx.insert(webhookEvents).values({ id: event.id, type: event.type }).onConflictDoNothing().returning({ id: webhookEvents.id });
    if (!fresh) return { applied: false, reason: 'duplicate' };
    const at = new Date(event.created * 1000);
    switch (event.type) {
      case 'account.updated': {
        // Only a connected account's own event moves its state (a platform event names no studio).
        if (!account) return { applied: false, reason: 'not a connected account' };
        await tx.update(paymentAccounts).set({ ...flagsOf(account), updatedAt: new Date() }).where(eq(paymentAccounts.providerAccountId, account.id));
        return { applied: true };
      }
      case 'checkout.session.completed': {
        if (!fetched) return { applied: false, reason: 'not a subscription checkout' };
        const session = event.data.object;
        return applySubscription(tx, fetched, at, { userId: session.client_reference_id ?? undefined, studioId: session.metadata?.studioId }, { current: true, route });
      }
      case 'customer.subscription.created':
      case 'customer.subscription.updated':
      case 'customer.subscription.deleted':
        // The provider's current state, whatever order the events came in.
        return applySubscription(tx, fetched!, at, {}, { current: true, route });
      case 'invoice.payment_failed': {
        const subId = subscriptionIdOf(event.data.object);
        if (subId) {
          const [member] = await tx
            .update(subscriptions)
            .set({ pastDueSince: new Date(), updatedAt: new Date() })
            .where(
              and(
                eq(subscriptions.providerSubscriptionId, subId),
                eq(subscriptions.status, 'past_due'),
                ...(route.studioId ? [eq(subscriptions.studioId, route.studioId)] : []),
              ),
            )
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

async function applySubscription(
  tx: Tx,
  sub: Stripe.Subscription,
  at: Date,
  hint: { userId?: string; studioId?: string } = {},
  { current = false, route = { studioId: null, accountId: null } as Route } = {},
) {
  const named = hint.studioId ?? sub.metadata?.studioId;
  // On a connected account the account decides the studio; what metadata says must agree with it.
  if (route.studioId && named && named !== route.studioId) return { applied: false, reason: 'names another studio than its account' };
  const studioId = route.studioId ?? named;
  const userId = hint.userId ?? sub.metadata?.userId;
  let [row] = await tx.select().from(subscriptions).where(eq(subscriptions.providerSubscriptionId, sub.id)).for('update');
  if (row && route.studioId && row.studioId !== route.studioId) return { applied: false, reason: 'belongs to another studio' };
  if (!row) {
    if (!studioId || !userId || !/^[0-9a-f-]{36}$/i.test(studioId)) return { applied: false, reason: 'no studio or member named' };
    // Only someone who belongs to that studio can hold its subscription (metadata is whatever the
    // checkout was given; a subscription made elsewhere must not grant a stranger access).
    const [member] = await tx
      .select({ userId: memberships.userId })
      .from(memberships)
      .where(and(eq(memberships.studioId, studioId), eq(memberships.userId, userId)))
      .limit(1);
    if (!member) return { applied: false, reason: 'not a member of that studio' };
    [row] = await tx.select().from(subscriptions).where(and(eq(subscriptions.studioId, studioId), eq(subscriptions.userId, userId))).for('update');
    // A late event about an ended subscription must not replace the member's newer, running one.
    if (row?.providerSubscriptionId && row.providerSubscriptionId !== sub.id && LIVE.includes(row.status) && !LIVE.includes(sub.status)) {
      return { applied: false, reason: 'about an older subscription' };
    }
    if (row?.providerSubscriptionId && row.providerSubscriptionId !== sub.id) row = { ...row, lastEventAt: null };
  }
  // A state fetched from the provider just now is never older than what is stored; an event's
  // own copy (checkout fallback, membership sync) may be.
  if (!current && row?.lastEventAt && at < row.lastEventAt) return { applied: false, reason: 'older than the last event applied' };

  const status = (SUBSCRIPTION_STATUSES as readonly string[]).includes(sub.status) ? (sub.status as Status) : 'incomplete';
  const item = sub.items?.data?.[0];
  const periodEnd = status === 'trialing' && sub.trial_end ? sub.trial_end : item?.current_period_end;
  const values = {
    providerCustomerId: typeof sub.customer === 'string' ? sub.customer : sub.customer.id,
    providerSubscriptionId: sub.id,
    ...(route.accountId ? { providerAccountId: route.accountId } : {}),
    status,
    trialEnd: sub.trial_end ? new Date(sub.trial_end * 1000) : null,
    currentPeriodEnd: periodEnd ? new Date(periodEnd * 1000) : null,
    cancelAtPeriodEnd: status !== 'canceled' && (sub.cancel_at_period_end || sub.cancel_at != null),
    pastDueSince: status === 'past_due' ? (row?.status === 'past_due' && row.pastDueSince ? row.pastDueSince : new Date()) : null,
    lastEventAt: row?.lastEventAt && row.lastEventAt > at ? row.lastEventAt : at,
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
  const list = await deps.stripe.subscriptions.list({ customer: row.providerCustomerId, limit: 1 }, onAccount(row.providerAccountId));
  const sub = list.data[0];
  if (!sub || sub.id === row.providerSubscriptionId) return;
  const route: Route = { studioId: row.providerAccountId ? studioId : null, accountId: row.providerAccountId };
  const result = await deps.db.transaction((tx) => applySubscription(tx, sub, new Date(sub.created * 1000), { studioId, userId }, { route }));
  if (result.applied) await accessChanged(deps, studioId);
}
