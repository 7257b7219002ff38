import { changePasswordInput } from '~/lib/api/auth-schemas';
import { app } from '~/server/app';
import { parseWith } from '~/server/http/api';
import { requireUser } from '~/server/http/guards';
import { clearSessionCookie } from '~/server/http/session-cookie';
import { changePassword, signOutEverywhere } from '~/server/services/accounts';
import { formAction } from './form-action';

export const accountActions = {
  /** "Change password" on the account page; answers what to tell the person. */
  changePassword: formAction(async (form, { locals }) => {
    const { user, session } = requireUser(locals);
    const input = parseWith(changePasswordInput, {
      currentPassword: form.get('currentPassword'),
      newPassword: form.get('newPassword'),
      signOutOthers: form.get('signOutOthers') === 'on',
    });
    await changePassword(app(), user.id, session.id, input);
    return input.signOutOthers ? 'Password changed. Your other devices are signed out.' : 'Password changed.';
  }),

  /** "Sign out everywhere": every session ends, this browser's included. */
  signOutEverywhere: formAction(async (_form, { locals, cookies }) => {
    const { user } = requireUser(locals);
    const deps = app();
    await signOutEverywhere(deps, user.id);
    clearSessionCookie(cookies, deps.auth);
    return '/sign-in';
  }),
};
