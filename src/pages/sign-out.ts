import type { APIRoute } from 'astro';
import { app } from '../server/app';
import { clearSessionCookie } from '../server/http/session-cookie';
import { signOut } from '../server/services/accounts';

/** The header's sign-out form posts here. */
export const POST: APIRoute = async ({ locals, cookies, redirect }) => {
  const deps = app();
  if (locals.session) await signOut(deps, locals.session.id);
  clearSessionCookie(cookies, deps.auth);
  return redirect('/', 303);
};
