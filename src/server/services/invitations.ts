import { and, desc, eq, gt, inArray, isNull, sql } from 'drizzle-orm';
import { invitations, memberships, studios, users } from '~/db/schema';
import type { AcceptAsNewAccountInput, CreateInvitationInput } from '~/lib/api/mail-schemas';
import type { AppDeps } from '../app';
import { newUserId, type NewSession } from '../auth/lucia';
import { hashPassword } from '../auth/passwords';
import { AppError, notFound } from '../errors';
import { sendInvitation } from '../mail/messages';
import { hashToken, newToken, TOKEN_LIFETIME } from '../mail/tokens';
import { signIn } from './accounts';
import type { StudioClock } from '~/lib/time/date-format';

export type StaffRole = 'coach' | 'editor';

/** A pending invitation as the team page shows it. */
export interface PendingInvitation {
  id: string;
  email: string;
  role: StaffRole;
  expiresAt: Date;
  createdAt: Date;
  expired: boolean;
  invitedByName: string | null;
}

export interface TeamMember {
  userId: string;
  name: string;
  email: string;
  roles: string[];
}

/** Staff of the studio and the invitations not yet accepted (expired ones too, marked, so the owner can resend). */
export async function teamOverview(deps: AppDeps, studioId: string): Promise<{ staff: TeamMember[]; pending: PendingInvitation[] }> {
  const rows = await deps.db
    .select({ userId: users.id, name: users.name, email: users.email, role: memberships.role })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.studioId, studioId), inArray(memberships.role, ['owner', 'coach', 'editor'])))
    .orderBy(users.name);
  const staff = new Map<string, TeamMember>();
  for (const r of rows) {
    const entry = staff.get(r.userId) ?? { userId: r.userId, name: r.name, email: r.email, roles: [] };
    entry.roles.push(r.role);
    staff.set(r.userId, entry);
  }
  const pendingRows = await deps.db
    .select({ inv: invitations, invitedByName: users.name })
    .from(invitations)
    .leftJoin(users, eq(users.id, invitations.invitedBy))
    .where(and(eq(invitations.studioId, studioId), isNull(invitations.acceptedAt)))
    .orderBy(desc(invitations.createdAt));
  const now = Date.now();
  const pending = pendingRows.map(({ inv, invitedByName }) => ({
    id: inv.id,
    email: inv.email,
    role: inv.role,
    expiresAt: inv.expiresAt,
    createdAt: inv.createdAt,
    expired: inv.expiresAt.getTime() <= now,
    invitedByName,
  }));
  return { staff: [...staff.values()], pending };
}

/**
 * Invites a coach or editor by e-mail. A newer invitation to the same address replaces any
 * pending one (the old link stops working). The invitation is kept only if its e-mail went out.
 */
export async function inviteStaff(
  deps: AppDeps,
  studioId: string,
  invitedBy: string,
  input: CreateInvitationInput,
): Promise<PendingInvitation> {
  const [already] = await deps.db
    .select({ name: users.name })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.studioId, studioId), eq(memberships.role, input.role), sql`lower(${users.email}) = ${input.email}`));
  if (already) {
    const message = `${already.name} is already ${input.role === 'coach' ? 'a coach' : 'an editor'} here.`;
    throw new AppError('conflict', message, { email: message });
  }
  const token = newToken();
  const inv = await deps.db.transaction(async (tx) => {
    await tx
      .delete(invitations)
      .where(and(eq(invitations.studioId, studioId), eq(invitations.email, input.email), isNull(invitations.acceptedAt)));
    const [row] = await tx
      .insert(invitations)
      .values({
        studioId,
        email: input.email,
        role: input.role,
        tokenHash: hashToken(token),
        invitedBy,
        expiresAt: new Date(Date.now() + TOKEN_LIFETIME.invitationDays * 86_400_000),
      })
      .returning();
    return row!;
  });
  try {
    await sendInvitation(deps, { invitationId: inv.id, token });
  } catch (err) {
    await deps.db.delete(invitations).where(eq(invitations.id, inv.id));
    console.error(`invitation e-mail to ${inv.email} not sent:`, err instanceof Error ? err.message : err);
    throw new AppError('unavailable', 'We could not send the invitation e-mail just now. Nothing was saved; please try again in a minute.');
  }
  const inviter = await deps.db.query.users.findFirst({ where: eq(users.id, invitedBy) });
  return {
    id: inv.id,
    email: inv.email,
    role: inv.role,
    expiresAt: inv.expiresAt,
    createdAt: inv.createdAt,
    expired: false,
    invitedByName: inviter?.name ?? null,
  };
}

/** Withdraws a pending invitation; its link stops working. Accepted ones and other studios' answer 404. */
export async function revokeInvitation(deps: AppDeps, studioId: string, id: string): Promise<void> {
  const removed = await deps.db
    .delete(invitations)
    .where(and(eq(invitations.id, id), eq(invitations.studioId, studioId), isNull(invitations.acceptedAt)))
    .returning({ id: invitations.id });
  if (!removed.length) throw notFound('That invitation');
}

export type InvitationState = 'open' | 'expired' | 'accepted' | 'invalid';

export interface InvitationLookup {
  state: InvitationState;
  email?: string;
  role?: StaffRole;
  expiresAt?: Date;
  studioName?: string;
  /** The inviting studio's clock, to show the expiry as that studio reads it. */
  studioClock?: StudioClock;
  inviterName?: string | null;
  /** Whether someone already has an account with the invited address (then they sign in to accept). */
  accountExists?: boolean;
}

/** What an invitation link leads to, for the accept page. */
export async function lookupInvitation(deps: AppDeps, token: string): Promise<InvitationLookup> {
  const [row] = await deps.db
    .select({ inv: invitations, studioName: studios.name, timeZone: studios.timeZone, locale: studios.locale, inviterName: users.name })
    .from(invitations)
    .innerJoin(studios, eq(studios.id, invitations.studioId))
    .leftJoin(users, eq(users.id, invitations.invitedBy))
    .where(eq(invitations.tokenHash, hashToken(token)));
  if (!row) return { state: 'invalid' };
  const { inv } = row;
  const account = await deps.db.query.users.findFirst({ where: sql`lower(${users.email}) = ${inv.email}` });
  return {
    state: inv.acceptedAt ? 'accepted' : inv.expiresAt.getTime() <= Date.now() ? 'expired' : 'open',
    email: inv.email,
    role: inv.role,
    expiresAt: inv.expiresAt,
    studioName: row.studioName,
    studioClock: { timeZone: row.timeZone, locale: row.locale },
    inviterName: row.inviterName,
    accountExists: !!account,
  };
}

const STATE_MESSAGES: Record<Exclude<InvitationState, 'open'>, string> = {
  expired: 'This invitation has expired. Ask the studio owner to send you a new one.',
  accepted: 'This invitation has already been accepted. Sign in to get started.',
  invalid: 'This invitation link is not valid, or it was withdrawn. Ask the studio owner to send a new one.',
};

/** The message for an invitation that cannot be accepted. */
export const invitationStateMessage = (state: Exclude<InvitationState, 'open'>) => STATE_MESSAGES[state];

type Tx = Parameters<Parameters<AppDeps['db']['transaction']>[0]>[0];

/** Marks the invitation accepted if it is still open for this address; returns it, or throws why not. */
async function claim(deps: AppDeps, tx: Tx, token: string, email: string, userId: string) {
  const [inv] = await tx
    .update(invitations)
    .set({ acceptedAt: new Date(), acceptedBy: userId })
    .where(
      and(
        eq(invitations.tokenHash, hashToken(token)),
        isNull(invitations.acceptedAt),
        gt(invitations.expiresAt, sql`now()`),
        eq(invitations.email, email.toLowerCase()),
      ),
    )
    .returning();
  if (inv) return inv;
  const found = await lookupInvitation(deps, token);
  if (found.state === 'open') {
    throw new AppError('forbidden', `This invitation was sent to ${found.email}. Sign in with that address to accept it.`);
  }
  throw new AppError(found.state === 'invalid' ? 'not_found' : 'conflict', invitationStateMessage(found.state));
}

/** Accepts for a signed-in person whose e-mail is the invited one: grants the role. */
export async function acceptInvitation(
  deps: AppDeps,
  token: string,
  user: { id: string; email: string },
): Promise<{ studioId: string; role: StaffRole }> {
  return deps.db.transaction(async (tx) => {
    const inv = await claim(deps, tx, token, user.email, user.id);
    await tx.insert(memberships).values({ userId: user.id, studioId: inv.studioId, role: inv.role }).onConflictDoNothing();
    return { studioId: inv.studioId, role: inv.role };
  });
}

/**
 * Signs in with the invited address's existing account and accepts in one step. The sign-in
 * counts against the same limits as the sign-in page. An invitation that closed meanwhile
 * (expired, withdrawn) is refused with the reason.
 */
export async function signInAndAcceptInvitation(
  deps: AppDeps,
  token: string,
  password: string,
  address: string,
): Promise<{ session: NewSession; role: StaffRole }> {
  const found = await lookupInvitation(deps, token);
  if (found.state !== 'open' || !found.email) {
    throw new AppError(found.state === 'invalid' ? 'not_found' : 'conflict', invitationStateMessage(found.state === 'open' ? 'invalid' : found.state));
  }
  const session = await signIn(deps, { email: found.email, password }, address);
  const { role } = await acceptInvitation(deps, token, { id: session.userId, email: found.email });
  return { session, role };
}

/**
 * Creates an account for the invited address and accepts in one step. Opening the e-mailed link
 * proves the address, so it counts as verified. Returns a new session.
 */
export async function acceptWithNewAccount(
  deps: AppDeps,
  token: string,
  input: AcceptAsNewAccountInput,
): Promise<{ session: NewSession; role: StaffRole }> {
  const found = await lookupInvitation(deps, token);
  if (found.state !== 'open') throw new AppError(found.state === 'invalid' ? 'not_found' : 'conflict', invitationStateMessage(found.state));
  if (found.accountExists) {
    throw new AppError('conflict', 'An account with this e-mail already exists. Sign in to accept the invitation.');
  }
  const userId = newUserId();
  const passwordHash = await hashPassword(input.password);
  const role = await deps.db.transaction(async (tx) => {
    await tx.insert(users).values({ id: userId, email: found.email!, name: input.name, passwordHash, emailVerifiedAt: new Date() });
    const inv = await claim(deps, tx, token, found.email!, userId);
    await tx.insert(memberships).values({ userId, studioId: inv.studioId, role: inv.role });
    return inv;
  });
  // The new account works in the studio that invited it.
  return { session: await deps.auth.createSession(userId, role.studioId), role: role.role };
}
