import { and, eq, ne, sql } from 'drizzle-orm';
import type { RateLimiterRes } from 'rate-limiter-flexible';
import { memberships, sessions, studios, users } from '~/db/schema';
import type { ChangePasswordInput, Role, SignInInput, SignUpInput } from '~/lib/api/auth-schemas';
import { AppError } from '../errors';
import { consumeEach, pleaseWait } from '../http/rate-limit';
import { hashPassword, verifyPassword } from '../auth/passwords';
import type { AppDeps } from '../app';
import { newUserId, type NewSession } from '../auth/lucia';

/** A studio role as the middleware puts it on Astro.locals. */
export interface StudioAccess {
  studioId: string;
  studioSlug: string;
  studioName: string;
  /** The studio's clock: every date on its pages is read in this zone and locale. */
  timeZone: string;
  locale: string;
  roles: Role[];
}

// A fixed hash to verify against when the account does not exist, so a wrong e-mail and a
// wrong password take the same time and say the same thing.
let decoyHash: Promise<string> | undefined;

const wrongCredentials = () =>
  new AppError('invalid_input', 'That e-mail and password do not match an account.', {
    password: 'That e-mail and password do not match an account.',
  });

function tooManyTries(res: RateLimiterRes): AppError {
  const minutes = Math.max(1, Math.ceil(res.msBeforeNext / 60_000));
  return new AppError(
    'rate_limited',
    `Too many sign-in attempts. Please wait ${minutes} minute${minutes === 1 ? '' : 's'} and try again, or reset your password.`,
    undefined,
    { retryAfterSeconds: Math.ceil(res.msBeforeNext / 1000) },
  );
}

/** The one answer to a sign-up, whether the address was new or already had an account. */
export const SIGN_UP_ANSWER =
  'Thanks! Check your inbox: we have sent a message to that address. You can sign in with your e-mail and password now.';

/**
 * Creates an account and makes it a member of the app's studio. When the address already has an
 * account nothing is created and its owner is e-mailed instead ("someone tried to sign up with
 * your address"). Both paths do the same work in the request (hash the password, try the insert,
 * queue one mail job) and the caller answers the same, so the form tells nobody who has an account
 * (issue 15, point 7). No session is opened: the person signs in.
 */
export async function signUp(deps: AppDeps, input: SignUpInput, address: string): Promise<void> {
  await consumeEach(
    [
      [deps.limits.signUpPerAddress, address],
      [deps.limits.signUpPerAccount, input.email],
    ],
    pleaseWait('sign-ups'),
  );
  const studio = await deps.db.query.studios.findFirst({ where: eq(studios.slug, deps.studioSlug) });
  const userId = newUserId();
  const passwordHash = await hashPassword(input.password);
  const created = await deps.db.transaction(async (tx) => {
    // The unique index on lower(email) decides, so two sign-ups racing for one address make one account.
    const [row] = await tx
      .insert(users)
      .values({ id: userId, email: input.email, name: input.name, passwordHash })
      .onConflictDoNothing()
      .returning({ id: users.id });
    if (row && studio) await tx.insert(memberships).values({ userId, studioId: studio.id, role: 'member' });
    return !!row;
  });
  if (created) await deps.jobs('mail.verify-email', { userId });
  else await deps.jobs('mail.sign-up-attempt', { email: input.email });
}

/**
 * Checks e-mail and password and opens a new session (never reuses one: OWASP ASVS 3.2.1).
 * Failed attempts count against the account and the caller's address.
 */
export async function signIn(deps: AppDeps, input: SignInInput, address: string): Promise<NewSession> {
  const [byAccount, byAddress] = await Promise.all([
    deps.limits.perAccount.get(input.email),
    deps.limits.perAddress.get(address),
  ]);
  for (const [res, limiter] of [
    [byAccount, deps.limits.perAccount],
    [byAddress, deps.limits.perAddress],
  ] as const) {
    if (res && res.consumedPoints >= limiter.points) throw tooManyTries(res);
  }

  const user = await deps.db.query.users.findFirst({ where: sql`lower(${users.email}) = ${input.email}` });
  decoyHash ??= hashPassword('decoy password that never matches');
  const ok = await verifyPassword(user?.passwordHash ?? (await decoyHash), input.password);
  if (!user || !ok) {
    await Promise.all([
      deps.limits.perAccount.penalty(input.email, 1),
      deps.limits.perAddress.penalty(address, 1),
    ]);
    throw wrongCredentials();
  }
  await deps.limits.perAccount.delete(input.email);
  return deps.auth.createSession(user.id);
}

/** Ends one session. */
export async function signOut(deps: AppDeps, sessionId: string): Promise<void> {
  await deps.auth.invalidateSession(sessionId);
}

/** Ends every session of a user except, optionally, the current one. */
export async function signOutEverywhere(deps: AppDeps, userId: string, keepSessionId?: string): Promise<void> {
  if (!keepSessionId) return deps.auth.invalidateUserSessions(userId);
  await deps.db.delete(sessions).where(and(eq(sessions.userId, userId), ne(sessions.id, keepSessionId)));
}

/** Changes a password after checking the current one; by default signs out other sessions (ASVS 3.3.3). */
export async function changePassword(
  deps: AppDeps,
  userId: string,
  currentSessionId: string,
  input: ChangePasswordInput,
): Promise<void> {
  const user = await deps.db.query.users.findFirst({ where: eq(users.id, userId) });
  if (!user || !(await verifyPassword(user.passwordHash, input.currentPassword))) {
    throw new AppError('invalid_input', 'Your current password is not right.', {
      currentPassword: 'Your current password is not right.',
    });
  }
  await deps.db
    .update(users)
    .set({ passwordHash: await hashPassword(input.newPassword), passwordChangedAt: new Date() })
    .where(eq(users.id, userId));
  if (input.signOutOthers) await signOutEverywhere(deps, userId, currentSessionId);
}

/** The studios a user belongs to, with their roles there. */
export async function studioAccess(deps: AppDeps, userId: string): Promise<StudioAccess[]> {
  const rows = await deps.db
    .select({ studioId: studios.id, studioSlug: studios.slug, studioName: studios.name, timeZone: studios.timeZone, locale: studios.locale, role: memberships.role })
    .from(memberships)
    .innerJoin(studios, eq(studios.id, memberships.studioId))
    .where(eq(memberships.userId, userId));
  const byStudio = new Map<string, StudioAccess>();
  for (const r of rows) {
    const { role, ...studio } = r;
    const entry = byStudio.get(r.studioId) ?? { ...studio, roles: [] };
    entry.roles.push(role);
    byStudio.set(r.studioId, entry);
  }
  return [...byStudio.values()];
}

/**
 * The studio a signed-in person acts in: the studio this deployment serves when they belong to
 * it, otherwise the first studio they belong to, or null. Middleware and both sign-ins use it, so
 * the landing page after sign-in and every later request agree.
 */
export async function resolveStudio(deps: AppDeps, userId: string): Promise<StudioAccess | null> {
  const studios = await studioAccess(deps, userId);
  return studios.find((s) => s.studioSlug === deps.studioSlug) ?? studios[0] ?? null;
}
