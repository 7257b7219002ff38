import { and, eq, ne, sql } from 'drizzle-orm';
import type { RateLimiterRes } from 'rate-limiter-flexible';
import { memberships, sessions, studios, users } from '~/db/schema';
import type { ChangePasswordInput, Role, SignInInput, SignUpInput } from '~/lib/api/auth-schemas';
import { AppError, notFound } from '../errors';
import { consumeEach, pleaseWait } from '../http/rate-limit';
import { hashPassword, verifyPassword } from '../auth/passwords';
import type { AppDeps } from '../app';
import { newUserId, type NewSession } from '../auth/lucia';
import { logoUrl } from '~/lib/studios/studio-logo';

/** A studio role as the middleware puts it on Astro.locals. */
export interface StudioAccess {
  studioId: string;
  studioSlug: string;
  studioName: string;
  /** The studio's clock: every date on its pages is read in this zone and locale. */
  timeZone: string;
  locale: string;
  /** The studio's logo (lib/studios/studio-logo.ts), or null. */
  logoUrl: string | null;
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

/** A checked, not yet stored account: write `row` inside the caller's transaction, then `openFirstSession`. */
export interface NewAccount {
  userId: string;
  row: typeof users.$inferInsert;
}

/**
 * The checks of an account made together with a studio ("start a studio"): sign-up limits and the
 * password hash. Answers null when the address already has an account; the caller then answers as
 * for a new address and mails its owner instead, so the form tells nobody who has an account
 * (the same rule as sign-up). The password is hashed either way, so both take the same time.
 */
export async function prepareAccount(deps: AppDeps, input: SignUpInput, address: string): Promise<NewAccount | null> {
  await consumeEach(
    [
      [deps.limits.signUpPerAddress, address],
      [deps.limits.signUpPerAccount, input.email],
    ],
    pleaseWait('sign-ups'),
  );
  const existing = await deps.db.query.users.findFirst({ where: sql`lower(${users.email}) = ${input.email}` });
  const userId = newUserId();
  const passwordHash = await hashPassword(input.password);
  return existing ? null : { userId, row: { id: userId, email: input.email, name: input.name, passwordHash } };
}

/** A unique-index refusal (PostgreSQL 23505, as drizzle's wrapper or pg's own error): two founders racing for one e-mail or one studio address. */
export const isUniqueViolation = (err: unknown) => {
  const e = err as { code?: string; cause?: { code?: string } } | null;
  return e?.code === '23505' || e?.cause?.code === '23505';
};

/** The new account's first session, working in `studioId`, and its confirmation e-mail. */
export async function openFirstSession(deps: AppDeps, userId: string, studioId: string | null): Promise<NewSession> {
  const session = await deps.auth.createSession(userId, studioId);
  await deps.jobs('mail.verify-email', { userId });
  return session;
}

/** The one answer to a sign-up, whether the address was new or already had an account. */
export const SIGN_UP_ANSWER =
  'Thanks! Check your inbox: we have sent a message to that address. You can sign in with your e-mail and password now.';

/**
 * Creates an account and makes it a member of the studio whose join page it came from (or, from
 * the API and the old sign-up address, the deployment's own studio). When the address already has an
 * account nothing is created and its owner is e-mailed instead ("someone tried to sign up with
 * your address"). Both paths do the same work in the request (hash the password, try the insert,
 * queue one mail job) and the caller answers the same, so the form tells nobody who has an account
 * (issue 15, point 7). No session is opened: the person signs in.
 */
export async function signUp(deps: AppDeps, input: SignUpInput, address: string, studioId: string | null = null): Promise<void> {
  await consumeEach(
    [
      [deps.limits.signUpPerAddress, address],
      [deps.limits.signUpPerAccount, input.email],
    ],
    pleaseWait('sign-ups'),
  );
  const studio = await deps.db.query.studios.findFirst({ where: studioId ? eq(studios.id, studioId) : eq(studios.slug, deps.studioSlug) });
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
    .select({ studioId: studios.id, studioSlug: studios.slug, studioName: studios.name, timeZone: studios.timeZone, locale: studios.locale, logoFile: studios.logoFile, role: memberships.role })
    .from(memberships)
    .innerJoin(studios, eq(studios.id, memberships.studioId))
    .where(eq(memberships.userId, userId));
  const byStudio = new Map<string, StudioAccess>();
  for (const r of rows) {
    const { role, logoFile, ...studio } = r;
    const entry = byStudio.get(r.studioId) ?? { ...studio, logoUrl: logoUrl(r.studioId, logoFile), roles: [] };
    entry.roles.push(role);
    byStudio.set(r.studioId, entry);
  }
  return [...byStudio.values()];
}

/**
 * The studio a signed-in person works in: the one chosen in this session (while they still
 * belong to it), or their only studio. Someone in several studios who has not chosen gets null
 * and is asked to choose: never "the first one". Middleware and both sign-ins use it.
 */
export async function resolveStudio(deps: AppDeps, userId: string, chosenStudioId: string | null = null): Promise<StudioAccess | null> {
  return pickStudio(await studioAccess(deps, userId), chosenStudioId);
}

/** The choice rule on a list already read. */
export function pickStudio(studios: StudioAccess[], chosenStudioId: string | null): StudioAccess | null {
  const chosen = chosenStudioId ? studios.find((s) => s.studioId === chosenStudioId) : undefined;
  return chosen ?? (studios.length === 1 ? studios[0]! : null);
}

/** Remembers the studio this session works in; a studio the person does not belong to is simply not there (404). */
export async function chooseStudio(deps: AppDeps, session: { sessionId: string; userId: string }, studioId: string): Promise<StudioAccess> {
  const access = (await studioAccess(deps, session.userId)).find((s) => s.studioId === studioId);
  if (!access) throw notFound('That studio');
  await deps.db.update(sessions).set({ currentStudioId: studioId }).where(and(eq(sessions.id, session.sessionId), eq(sessions.userId, session.userId)));
  return access;
}

/**
 * A signed-in person joins another studio as a member from its join page (one person, several
 * studios). Joining twice changes nothing. This session then works in that studio.
 */
export async function joinStudio(deps: AppDeps, session: { sessionId: string; userId: string }, studioId: string): Promise<StudioAccess> {
  const studio = await deps.db.query.studios.findFirst({ where: eq(studios.id, studioId), columns: { id: true } });
  if (!studio) throw notFound('That studio');
  await deps.db.insert(memberships).values({ userId: session.userId, studioId, role: 'member' }).onConflictDoNothing();
  return chooseStudio(deps, session, studioId);
}
