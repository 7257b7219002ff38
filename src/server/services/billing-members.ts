import { and, asc, desc, eq, ilike, or, sql, type SQL } from 'drizzle-orm';
import { memberships, subscriptions, users } from '~/db/schema';
import type { MemberRow, MembersQuery } from '~/lib/api/billing-schemas';
import type { AppDeps } from '../app';

/**
 * The owner's members table: every member of the studio with their membership status, since
 * when, trial end and the promo code they used; searchable by name or e-mail and sortable.
 */
export async function listMembers(deps: AppDeps, studioId: string, query: Pick<MembersQuery, 'q' | 'sort' | 'dir'>): Promise<MemberRow[]> {
  const hasSub = sql`${subscriptions.providerSubscriptionId} is not null`;
  const status = sql<string>`case when ${hasSub} then ${subscriptions.status}::text else 'none' end`;
  const since = sql<Date | null>`case when ${hasSub} then ${subscriptions.createdAt} end`;
  const columns: Record<MembersQuery['sort'], SQL> = {
    name: sql`lower(${users.name})`,
    email: sql`lower(${users.email})`,
    status,
    since,
    trialEnd: sql`${subscriptions.trialEnd}`,
  };
  const order = query.dir === 'desc' ? desc : asc;
  const like = query.q ? `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%` : null;
  const rows = await deps.db
    .select({
      userId: users.id,
      name: users.name,
      email: users.email,
      status,
      since,
      trialEnd: subscriptions.trialEnd,
      promoCode: subscriptions.promoCode,
    })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .leftJoin(subscriptions, and(eq(subscriptions.userId, users.id), eq(subscriptions.studioId, studioId)))
    .where(and(eq(memberships.studioId, studioId), eq(memberships.role, 'member'), like ? or(ilike(users.name, like), ilike(users.email, like)) : undefined))
    // Empty values sort last either way; the name breaks ties so the order is stable.
    .orderBy(sql`${order(columns[query.sort])} nulls last`, asc(sql`lower(${users.name})`));
  return rows.map((r) => ({
    userId: r.userId,
    name: r.name,
    email: r.email,
    status: r.status as MemberRow['status'],
    since: r.since ? new Date(r.since).toISOString() : null,
    trialEnd: r.status !== 'none' && r.trialEnd ? r.trialEnd.toISOString() : null,
    promoCode: r.status !== 'none' ? r.promoCode : null,
  }));
}
