import type { AstroCookies } from 'astro';
import type { Auth, NewSession } from '../auth/lucia';

/** Sets the HttpOnly session cookie for a new session: the cookie carries its token, not the stored id. */
export function setSessionCookie(cookies: AstroCookies, auth: Auth, session: NewSession): void {
  const c = auth.createSessionCookie(session.token);
  cookies.set(c.name, c.value, { ...c.attributes, httpOnly: true });
}

/** Blanks the session cookie. */
export function clearSessionCookie(cookies: AstroCookies, auth: Auth): void {
  const c = auth.createBlankSessionCookie();
  cookies.set(c.name, c.value, { ...c.attributes, httpOnly: true });
}
