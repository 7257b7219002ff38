import { sendSignUpAttempt } from '../mail/messages';
import { sendPasswordResetLink, sendVerificationLink, userByEmail } from '../services/email-auth';
import type { JobHandler } from './job-context';

// Account mail runs here rather than in the request, so a sign-up or reset request does the same
// work whether or not the address has an account (issue 15, point 7). Throwing retries the job.

/** The first "confirm your address" link of a new account. */
export const mailVerifyEmail: JobHandler<'mail.verify-email'> = async ({ userId }, ctx) => {
  const status = await sendVerificationLink(ctx.deps, userId);
  return { outcome: status === 'sent' ? 'done' : 'skipped', detail: status };
};

/** Tells an account's owner that someone tried to sign up with their address. */
export const mailSignUpAttempt: JobHandler<'mail.sign-up-attempt'> = async ({ email, signInPath }, ctx) => {
  const user = await userByEmail(ctx.deps, email);
  if (!user) return { outcome: 'skipped', detail: 'no account (removed meanwhile)' };
  await sendSignUpAttempt(ctx.deps, { userId: user.id, signInPath });
  return { outcome: 'done' };
};

/** A "forgot password" request: a link when the address has an account. */
export const mailPasswordReset: JobHandler<'mail.password-reset'> = async ({ email }, ctx) => {
  const status = await sendPasswordResetLink(ctx.deps, email);
  return { outcome: status === 'sent' ? 'done' : 'skipped', detail: status };
};
