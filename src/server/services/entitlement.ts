import { and, eq, inArray } from 'drizzle-orm';
import { billingSettings, memberships, subscriptions } from '~/db/schema';
import type { AppDeps } from '../app';

const STAFF_ROLES = ['owner', 'coach', 'editor'] as const;
const DAY_MS = 86_400_000;

/** The subscription facts entitlement depends on. */
export interface EntitlementFacts {
  status: string;
  pastDueSince: Date | null;
}

/**
 * The rule itself: watching is allowed while `trialing` or `active` (a subscription cancelled at
 * period end stays `active` until then), and while `past_due` for the studio's grace days.
 */
export function entitledBy(sub: EntitlementFacts | null | undefined, graceDays: number, now = new Date()): boolean {
  if (!sub) return false;
  if (sub.status === 'trialing' || sub.status === 'active') return true;
  if (sub.status === 'past_due') {
    const since = sub.pastDueSince ?? now;
    return now.getTime() - since.getTime() <= graceDays * DAY_MS;
  }
  return false;
}

/**
 * Whether a person may watch the studio's classes: staff (owner, coach, editor) always; members
 * by their subscription's state as last reported by the payment provider.
 */
export async function hasEntitlement(deps: AppDeps, studioId: string, userId: string): Promise<boolean> {
  const [staff] = await deps.db
    .select({ id: memberships.id })
    .from(memberships)
    .where(and(eq(memberships.studioId, studioId), eq(memberships.userId, userId), inArray(memberships.role, [...STAFF_ROLES])))
    .limit(1);
  if (staff) return true;
  const [row] = await deps.db
    .select({ status: subscriptions.status, pastDueSince: subscriptions.pastDueSince, graceDays: billingSettings.pastDueGraceDays })
    .from(subscriptions)
    .leftJoin(billingSettings, eq(billingSettings.studioId, subscriptions.studioId))
    .where(and(eq(subscriptions.studioId, studioId), eq(subscriptions.userId, userId)));
  return entitledBy(row, row?.graceDays ?? 3);
}
