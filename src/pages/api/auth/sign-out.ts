import type { APIRoute } from 'astro';
import { signedOutOutput } from '~/lib/api/auth-schemas';
import { app } from '~/server/app';
import { answer, endpoint } from '~/server/http/api';
import { clearSessionCookie } from '~/server/http/session-cookie';
import { requireUser } from '~/server/http/guards';
import { signOut, signOutEverywhere } from '~/server/services/accounts';

/** Ends this session, or every session of the user with `?everywhere=1`. */
export const POST: APIRoute = endpoint(async ({ locals, cookies, url }) => {
  const { user, session } = requireUser(locals);
  const deps = app();
  if (url.searchParams.get('everywhere') === '1') await signOutEverywhere(deps, user.id);
  else await signOut(deps, session.id);
  clearSessionCookie(cookies, deps.auth);
  return answer(signedOutOutput, { signedOut: true });
});
