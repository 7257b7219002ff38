import type { AstroCookies } from 'astro';
import type { Session } from 'lucia';
import type { Auth } from '../auth/lucia';

/** Sets the HttpOnly session cookie for a new session. */
export function setSessionCookie(cookies: AstroCookies, auth: Auth, session: Session): void {
  const c = auth.createSessionCookie(session.id);
  cookies.set(c.name, c.value, { ...c.attributes, httpOnly: true });
}

/** Blanks the session cookie. */
export function clearSessionCookie(cookies: AstroCookies, auth: Auth): void {
  const c = auth.createBlankSessionCookie();
  cookies.set(c.name, c.value, { ...c.attributes, httpOnly: true });
}
