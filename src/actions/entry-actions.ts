import { signInInput, signUpInput } from '~/lib/api/auth-schemas';
import { acceptAsNewAccountInput, forgotPasswordInput, resetPasswordInput } from '~/lib/api/mail-schemas';
import { app } from '~/server/app';
import { parseWith } from '~/server/http/api';
import { requestAddress } from '~/server/http/client-address';
import { homeAfterSignIn, requireUser } from '~/server/http/guards';
import { clearSessionCookie, setSessionCookie } from '~/server/http/session-cookie';
import { joinStudio, resolveStudio, SIGN_UP_ANSWER, signIn, signUp } from '~/server/services/accounts';
import { notFound } from '~/server/errors';
import { FORGOT_PASSWORD_ANSWER, requestPasswordReset, resetPassword, sendVerificationLink } from '~/server/services/email-auth';
import { acceptInvitation, acceptWithNewAccount, signInAndAcceptInvitation } from '~/server/services/invitations';
import { formAction, formValues } from './form-action';

// Where every way of joining through an invitation lands.
const STAFF_HOME = '/studio/classes';
const invitationPassword = signInInput.pick({ password: true });

/**
 * The account-entry forms (sign-in, sign-up, password reset, e-mail confirmation, invitations).
 * Each calls the same service as its JSON endpoint under /api/auth; limits key on the address
 * src/serve.ts resolved (`requestAddress`).
 */
export const entryActions = {
  /** "Sign in": answers the person's home page; the page may send them to `?next=` instead. */
  signIn: formAction(async (form, ctx) => {
    const deps = app();
    const session = await signIn(deps, parseWith(signInInput, formValues(form)), requestAddress(ctx));
    setSessionCookie(ctx.cookies, deps.auth, session);
    return homeAfterSignIn(await resolveStudio(deps, session.userId));
  }),

  /** "Create account": the same answer whether or not the address already has an account. */
  signUp: formAction(async (form, ctx) => {
    // On a studio's join page (/s/{slug}/join) the account joins that studio.
    await signUp(app(), parseWith(signUpInput, formValues(form)), requestAddress(ctx), ctx.locals.pageStudio?.id ?? null);
    return SIGN_UP_ANSWER;
  }),

  /** "Join" on a studio's join page, for someone already signed in: they become a member there. */
  joinStudio: formAction(async (_form, ctx) => {
    const { user, session } = requireUser(ctx.locals);
    const studio = ctx.locals.pageStudio;
    if (!studio) throw notFound('That studio');
    const access = await joinStudio(app(), { sessionId: session.id, userId: user.id }, studio.id);
    return `/s/${access.studioSlug}/library`;
  }),

  /** "Send me a link": the same answer whether or not the address has an account. */
  forgotPassword: formAction(async (form, ctx) => {
    await requestPasswordReset(app(), parseWith(forgotPasswordInput, formValues(form)), requestAddress(ctx));
    return FORGOT_PASSWORD_ANSWER;
  }),

  /** "Save my new password" from a reset link: every session ends, this browser's included. */
  resetPassword: formAction(async (form, { cookies }) => {
    const deps = app();
    await resetPassword(deps, parseWith(resetPasswordInput, formValues(form)));
    clearSessionCookie(cookies, deps.auth);
    return 'done' as const;
  }),

  /** "Send a new link" on the confirm-your-e-mail page. */
  resendVerificationLink: formAction(async (_form, { locals }) => {
    const { user } = requireUser(locals);
    return sendVerificationLink(app(), user.id);
  }),

  /** "Join as …" for a signed-in person with the invited address. */
  acceptInvitation: formAction(async (_form, { locals, params }) => {
    const { user } = requireUser(locals);
    await acceptInvitation(app(), params.token ?? '', user);
    return STAFF_HOME;
  }),

  /** "Sign in and join": the invited address already has an account. */
  signInToAcceptInvitation: formAction(async (form, ctx) => {
    const deps = app();
    const { password } = parseWith(invitationPassword, formValues(form));
    const { session } = await signInAndAcceptInvitation(deps, ctx.params.token ?? '', password, requestAddress(ctx));
    setSessionCookie(ctx.cookies, deps.auth, session);
    return STAFF_HOME;
  }),

  /** "Create my account and join". */
  acceptInvitationAsNewAccount: formAction(async (form, { params, cookies }) => {
    const deps = app();
    const { session } = await acceptWithNewAccount(deps, params.token ?? '', parseWith(acceptAsNewAccountInput, formValues(form)));
    setSessionCookie(cookies, deps.auth, session);
    return STAFF_HOME;
  }),
};
