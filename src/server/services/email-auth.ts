import { and, count, eq, gt, isNull, sql } from 'drizzle-orm';
import { emailTokens, users } from '~/db/schema';
import type { ForgotPasswordInput, ResetPasswordInput } from '~/lib/api/mail-schemas';
import type { AppDeps } from '../app';
import { hashPassword } from '../auth/passwords';
import { AppError } from '../errors';
import { consumeEach, pleaseWait } from '../http/rate-limit';
import { sendPasswordReset, sendVerifyEmail } from '../mail/messages';
import { hashToken, newToken, TOKEN_LIFETIME } from '../mail/tokens';

type Purpose = 'verify-email' | 'reset-password';

// Caps on links sent per account, so the forms cannot be used to flood someone's inbox.
// Common practice, no source.
const MAX_VERIFY_LINKS_PER_HOUR = 5;
const MAX_RESET_LINKS_PER_15_MIN = 3;

async function recentTokens(deps: AppDeps, userId: string, purpose: Purpose, minutes: number): Promise<number> {
  const [row] = await deps.db
    .select({ n: count() })
    .from(emailTokens)
    .where(
      and(
        eq(emailTokens.userId, userId),
        eq(emailTokens.purpose, purpose),
        gt(emailTokens.createdAt, sql`now() - make_interval(mins => ${minutes})`),
      ),
    );
  return row?.n ?? 0;
}

async function issueToken(deps: AppDeps, userId: string, purpose: Purpose, lifetimeMs: number): Promise<string> {
  const token = newToken();
  await deps.db.insert(emailTokens).values({
    tokenHash: hashToken(token),
    userId,
    purpose,
    expiresAt: new Date(Date.now() + lifetimeMs),
  });
  return token;
}

/**
 * Sends a "confirm your address" link unless the address is already confirmed. Throws
 * rate_limited after several links in an hour.
 */
export async function sendVerificationLink(deps: AppDeps, userId: string): Promise<'sent' | 'already-verified'> {
  const user = await deps.db.query.users.findFirst({ where: eq(users.id, userId) });
  if (!user) throw new AppError('not_found', 'That account could not be found.');
  if (user.emailVerifiedAt) return 'already-verified';
  if ((await recentTokens(deps, userId, 'verify-email', 60)) >= MAX_VERIFY_LINKS_PER_HOUR) {
    throw new AppError(
      'rate_limited',
      'We have sent several links in the last hour. Please look for them in your inbox (and spam folder), or try again later.',
      undefined,
      { retryAfterSeconds: 3600 },
    );
  }
  const token = await issueToken(deps, userId, 'verify-email', TOKEN_LIFETIME.verifyEmailHours * 3_600_000);
  await sendVerifyEmail(deps, { userId, token });
  return 'sent';
}

export type VerifyResult = 'verified' | 'already-verified' | 'expired' | 'invalid';

/** Confirms an address from an e-mailed link. Each link works once; a second use says it is already done. */
export async function verifyEmail(deps: AppDeps, token: string): Promise<VerifyResult> {
  const tokenHash = hashToken(token);
  const used = await deps.db
    .update(emailTokens)
    .set({ usedAt: new Date() })
    .where(
      and(
        eq(emailTokens.tokenHash, tokenHash),
        eq(emailTokens.purpose, 'verify-email'),
        isNull(emailTokens.usedAt),
        gt(emailTokens.expiresAt, sql`now()`),
      ),
    )
    .returning({ userId: emailTokens.userId });
  if (used[0]) {
    await deps.db
      .update(users)
      .set({ emailVerifiedAt: new Date() })
      .where(and(eq(users.id, used[0].userId), isNull(users.emailVerifiedAt)));
    return 'verified';
  }
  const row = await deps.db.query.emailTokens.findFirst({
    where: and(eq(emailTokens.tokenHash, tokenHash), eq(emailTokens.purpose, 'verify-email')),
  });
  if (!row) return 'invalid';
  const user = await deps.db.query.users.findFirst({ where: eq(users.id, row.userId) });
  if (user?.emailVerifiedAt) return 'already-verified';
  return row.usedAt ? 'invalid' : 'expired';
}

/** Whether the signed-in person has confirmed their address (for the gentle banner). */
export async function isEmailVerified(deps: AppDeps, userId: string): Promise<boolean> {
  const [row] = await deps.db.select({ at: users.emailVerifiedAt }).from(users).where(eq(users.id, userId));
  return !!row?.at;
}

/** The one answer to "forgot password", whether or not the address has an account. */
export const FORGOT_PASSWORD_ANSWER =
  'If an account uses that address, a link to choose a new password is on its way. It works for one hour. Check your spam folder if it does not arrive in a few minutes.';

/**
 * Starts a password reset. The request only counts against the limits and queues a job, so it
 * does the same work, and answers the same, whether or not the address has an account (issue 15,
 * point 7); the lookup and the link happen in the job (`sendPasswordResetLink`).
 */
export async function requestPasswordReset(deps: AppDeps, input: ForgotPasswordInput, address: string): Promise<void> {
  await consumeEach(
    [
      [deps.limits.resetPerAddress, address],
      [deps.limits.resetPerAccount, input.email],
    ],
    pleaseWait('password-reset requests'),
  );
  await deps.jobs('mail.password-reset', { email: input.email });
}

/** The account with this address (any case), if there is one. */
export async function userByEmail(deps: AppDeps, email: string) {
  return deps.db.query.users.findFirst({ where: sql`lower(${users.email}) = ${email.toLowerCase()}` });
}

/**
 * The job's half of a reset request: e-mails a link when the address has an account and fewer
 * than three links went out in 15 minutes. Throws when the SMTP server refuses, so the job retries.
 */
export async function sendPasswordResetLink(deps: AppDeps, email: string): Promise<'sent' | 'no-account' | 'capped'> {
  const user = await userByEmail(deps, email);
  if (!user) return 'no-account';
  if ((await recentTokens(deps, user.id, 'reset-password', 15)) >= MAX_RESET_LINKS_PER_15_MIN) return 'capped';
  const token = await issueToken(deps, user.id, 'reset-password', TOKEN_LIFETIME.resetPasswordMinutes * 60_000);
  await sendPasswordReset(deps, { userId: user.id, token });
  return 'sent';
}

export type ResetTokenState = 'usable' | 'used' | 'expired' | 'invalid';

/** What a reset link's token can still do (the reset page shows the form only for a usable one). */
export async function resetTokenState(deps: AppDeps, token: string): Promise<ResetTokenState> {
  const row = await deps.db.query.emailTokens.findFirst({
    where: and(eq(emailTokens.tokenHash, hashToken(token)), eq(emailTokens.purpose, 'reset-password')),
  });
  if (!row) return 'invalid';
  if (row.usedAt) return 'used';
  if (row.expiresAt.getTime() <= Date.now()) return 'expired';
  return 'usable';
}

const RESET_TOKEN_MESSAGES: Record<Exclude<ResetTokenState, 'usable'>, string> = {
  used: 'This reset link has already been used. If you still need a new password, ask for another link.',
  expired: 'This reset link has expired (links work for one hour). Ask for a new one and use it soon after it arrives.',
  invalid: 'This reset link is not valid. Open the link from the e-mail again, or ask for a new one.',
};

/** The message for a reset link that cannot be used. */
export const resetTokenMessage = (state: Exclude<ResetTokenState, 'usable'>) => RESET_TOKEN_MESSAGES[state];

/**
 * Sets a new password from a reset link. The link works once and for an hour; afterwards every
 * session of the account is signed out (a stolen session should not outlive a reset), other reset
 * links stop working, and the sign-in lock on the account is lifted.
 */
export async function resetPassword(deps: AppDeps, input: ResetPasswordInput): Promise<{ userId: string }> {
  const tokenHash = hashToken(input.token);
  const passwordHash = await hashPassword(input.newPassword);
  const userId = await deps.db.transaction(async (tx) => {
    const [used] = await tx
      .update(emailTokens)
      .set({ usedAt: new Date() })
      .where(
        and(
          eq(emailTokens.tokenHash, tokenHash),
          eq(emailTokens.purpose, 'reset-password'),
          isNull(emailTokens.usedAt),
          gt(emailTokens.expiresAt, sql`now()`),
        ),
      )
      .returning({ userId: emailTokens.userId });
    if (!used) return null;
    await tx
      .update(users)
      // Opening the e-mailed link also proves the address.
      .set({ passwordHash, passwordChangedAt: new Date(), emailVerifiedAt: sql`coalesce(${users.emailVerifiedAt}, now())` })
      .where(eq(users.id, used.userId));
    await tx
      .update(emailTokens)
      .set({ usedAt: new Date() })
      .where(and(eq(emailTokens.userId, used.userId), eq(emailTokens.purpose, 'reset-password'), isNull(emailTokens.usedAt)));
    return used.userId;
  });
  if (!userId) {
    const state = await resetTokenState(deps, input.token);
    const message = resetTokenMessage(state === 'usable' ? 'invalid' : state);
    throw new AppError('invalid_input', message, { token: message });
  }
  await deps.auth.invalidateUserSessions(userId);
  const user = await deps.db.query.users.findFirst({ where: eq(users.id, userId) });
  if (user) await deps.limits.perAccount.delete(user.email.toLowerCase());
  return { userId };
}
