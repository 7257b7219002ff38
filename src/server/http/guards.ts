import { can, refusalFor, type Action, type Actor } from '~/lib/policy';
import type { StudioAccess } from '../services/accounts';
import { AppError, notFound } from '../errors';

type Locals = App.Locals;
export type SignedIn = { user: NonNullable<Locals['user']>; session: NonNullable<Locals['session']> };
export type InStudio = SignedIn & { studio: StudioAccess };

/** 401 unless signed in. */
export function requireUser(locals: Locals): SignedIn {
  if (!locals.user || !locals.session) throw new AppError('unauthenticated', 'Please sign in first.');
  return { user: locals.user, session: locals.session };
}

/** The signed-in person acting in their studio, for a use case to check; 401 signed out, 403 with no studio. */
export function requireActor(locals: Locals): Actor {
  const { user } = requireUser(locals);
  if (!locals.studio) throw new AppError('forbidden', 'Your account does not belong to this studio.');
  return actorOf(user.id, locals.studio);
}

/** The person as they act in the studio a URL names: any studio they belong to; any other is simply not there (404). */
export function actorIn(locals: Locals, studioId: string): Actor {
  const { user } = requireUser(locals);
  const studio = locals.studios.find((s) => s.studioId === studioId);
  if (!studio) throw notFound('That studio');
  return actorOf(user.id, studio);
}

export const actorOf = (userId: string, studio: StudioAccess): Actor => ({ userId, studioId: studio.studioId, roles: studio.roles });

/** For reads: 401 signed out, 403 unless the policy table allows the action. Writes check inside their use case. */
export function requireCan(locals: Locals, action: Action): InStudio {
  const signedIn = requireUser(locals);
  const studio = locals.studio;
  if (!studio || !can(studio, action)) throw new AppError('forbidden', refusalFor(action));
  return { ...signedIn, studio };
}

/** Whether the policy table lets the signed-in person do this (for showing or hiding controls). */
export const mayDo = (locals: Pick<Locals, 'studio'>, action: Action): boolean => can(locals.studio, action);

/** Where each person lands after signing in. */
export function homePath(locals: Pick<Locals, 'studio'>): string {
  const roles = locals.studio?.roles ?? [];
  if (roles.includes('owner')) return '/studio';
  if (roles.includes('coach') || roles.includes('editor')) return '/studio/classes';
  return locals.studio ? `/s/${locals.studio.studioSlug}/library` : '/studios';
}

/**
 * Where an address from the single-studio days (/library, /classes/{class}) leads now: the same
 * page under the studio this person works in. Visitors sign in first and come back; someone with
 * no studio chooses one. Not permanent (it depends on who asks), so a 302.
 */
export function studioAddressOf(locals: Pick<Locals, 'user' | 'studio'>, url: URL, rest: string): string {
  if (!locals.user) return `/sign-in?next=${encodeURIComponent(url.pathname + url.search)}`;
  if (!locals.studio) return '/studios';
  return `/s/${locals.studio.studioSlug}${rest}${url.search}`;
}

/** Where sign-in lands: the home of the studio worked in, or the studio chooser when there is none yet. */
export function homeAfterSignIn(studio: Locals['studio']): string {
  return studio ? homePath({ studio }) : '/studios';
}

/**
 * For pages: the signed-in studio user, or what to do instead (send to sign-in, or show 403).
 */
export function guardPage(
  locals: Locals,
  action: Action,
): { ok: true; access: InStudio; actor: Actor } | { ok: false; reason: 'sign-in' | 'forbidden' } {
  if (!locals.user || !locals.session) return { ok: false, reason: 'sign-in' };
  if (!locals.studio || !can(locals.studio, action)) return { ok: false, reason: 'forbidden' };
  return {
    ok: true,
    access: { user: locals.user, session: locals.session, studio: locals.studio },
    actor: actorOf(locals.user.id, locals.studio),
  };
}
