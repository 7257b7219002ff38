import { defineMiddleware } from 'astro:middleware';
import type { APIContext, MiddlewareNext } from 'astro';
import { app } from './server/app';
import { pickStudio, studioAccess } from './server/services/accounts';
import { studioAtAddress } from './server/services/studio-identity';
import { isRouteId } from './lib/api/route-params';
import { bodyLimitFor, errorResponse, tooLarge } from './server/http/api';
import { notFound } from './server/errors';
import { withSecurityHeaders } from './server/http/security-headers';
import { databaseUnavailable, isDatabaseUnavailable } from './server/unavailable';

/** Pages that show one studio's data (the API answers 403/404 by itself instead). */
const needsStudio = (pathname: string) => /^\/(studio|library|classes|account\/membership)(\/|$)/.test(pathname);

const isApiPath = (pathname: string) => pathname.startsWith('/api/') || pathname.startsWith('/media/');

/**
 * Turns away requests that name no stored row or carry an oversize body, then reads the session
 * cookie, validates the session (lucia extends it when used in its second half), refreshes or
 * blanks the cookie, and puts user, session and studio roles on locals.
 */
export const onRequest = defineMiddleware(async (context, next) => {
  try {
    return await handle(context, next);
  } catch (err) {
    // The session check (or a page) could not reach the database: a clear 503, never a stack.
    if (!isDatabaseUnavailable(err)) throw err;
    const response = isApiPath(context.url.pathname) ? errorResponse(databaseUnavailable()) : unavailablePage();
    return withSecurityHeaders(response, { signedIn: false, https: context.url.protocol === 'https:' });
  }
});

const unavailablePage = () =>
  new Response(`<!doctype html><html lang="en"><meta charset="utf-8"><title>Back in a minute · Roundmark</title><p>${databaseUnavailable().message}</p></html>`, {
    status: 503,
    headers: { 'content-type': 'text/html; charset=utf-8', 'retry-after': '30' },
  });

const handle = async (context: APIContext, next: MiddlewareNext): Promise<Response> => {
  // Every [id] route names a stored row by UUID; anything else is simply not there.
  const id = context.params.id;
  const early = (response: Response) => withSecurityHeaders(response, { signedIn: false, https: context.url.protocol === 'https:' });
  if (id !== undefined && !isRouteId(id)) {
    return early(isApiPath(context.url.pathname) ? errorResponse(notFound()) : new Response('Not found', { status: 404, headers: { 'content-type': 'text/plain; charset=utf-8' } }));
  }
  const limit = bodyLimitFor(context.url.pathname);
  if (Number(context.request.headers.get('content-length') ?? 0) > limit) {
    return early(
      isApiPath(context.url.pathname)
        ? errorResponse(tooLarge(limit))
        : new Response('The form sent more than this page accepts.', { status: 413, headers: { 'content-type': 'text/plain; charset=utf-8' } }),
    );
  }
  context.locals.user = null;
  context.locals.session = null;
  context.locals.studio = null;
  context.locals.studios = [];
  context.locals.pageStudio = null;
  const deps = app();
  // The cookie carries the session's token; the database knows only its hash (src/server/auth/lucia.ts).
  const token = context.cookies.get(deps.auth.sessionCookieName)?.value ?? null;
  if (token) {
    const { session, user } = await deps.auth.validateSession(token);
    if (session?.fresh) {
      const c = deps.auth.createSessionCookie(token);
      context.cookies.set(c.name, c.value, { ...c.attributes, httpOnly: true });
    }
    if (!session) {
      const c = deps.auth.createBlankSessionCookie();
      context.cookies.set(c.name, c.value, { ...c.attributes, httpOnly: true });
    }
    if (session && user) {
      context.locals.session = session;
      context.locals.user = user;
      context.locals.studios = await studioAccess(deps, user.id);
      context.locals.studio = pickStudio(context.locals.studios, session.currentStudioId);
      // Someone in several studios works in the one they chose; until then studio pages ask.
      if (!context.locals.studio && context.locals.studios.length > 1 && needsStudio(context.url.pathname)) {
        return context.redirect(`/studios?next=${encodeURIComponent(context.url.pathname + context.url.search)}`);
      }
    }
  }
  // Member-facing pages live under the studio's address; an address the studio left redirects for good.
  const address = /^\/s\/([A-Za-z0-9-]{1,80})(\/.*)?$/.exec(context.url.pathname);
  if (address) {
    const found = await studioAtAddress(deps, address[1]!.toLowerCase());
    if (found && 'movedTo' in found) {
      return early(new Response(null, { status: 308, headers: { location: `/s/${found.movedTo}${address[2] ?? ''}${context.url.search}` } }));
    }
    if (found) {
      context.locals.pageStudio = found.studio;
      // On a studio's pages a person works in that studio (for this request; the session's choice stays).
      // Someone not in it sees it as a visitor would (never another studio's data under its address).
      context.locals.studio = context.locals.studios.find((s) => s.studioId === found.studio.id) ?? null;
    }
  }
  let response = await next();
  // A path no route matches (say an id holding a quote or a slash) gets the framework's HTML 404 page; API callers get the usual error body.
  if (response.status === 404 && isApiPath(context.url.pathname) && !(response.headers.get('content-type') ?? '').includes('json')) {
    response = errorResponse(notFound());
  }
  return withSecurityHeaders(response, { signedIn: !!context.locals.user, https: context.url.protocol === 'https:' });
};

