import type { Role } from '~/lib/api/auth-schemas';
import type { StudioAccess } from '../services/accounts';
import { AppError } from './app-error';

type Locals = App.Locals;
export type SignedIn = { user: NonNullable<Locals['user']>; session: NonNullable<Locals['session']> };
export type InStudio = SignedIn & { studio: StudioAccess };

/** Staff roles: people who prepare classes. */
export const STAFF: Role[] = ['owner', 'coach', 'editor'];
/** Roles that may publish, price and invite. */
export const PUBLISHERS: Role[] = ['owner', 'coach'];

/** 401 unless signed in. */
export function requireUser(locals: Locals): SignedIn {
  if (!locals.user || !locals.session) throw new AppError('unauthenticated', 'Please sign in first.');
  return { user: locals.user, session: locals.session };
}

/** 401 when signed out, 403 when the user holds none of the allowed roles in their studio. */
export function requireRole(locals: Locals, allowed: readonly Role[]): InStudio {
  const signedIn = requireUser(locals);
  const studio = locals.studio;
  if (!studio || !studio.roles.some((r) => allowed.includes(r))) {
    throw new AppError('forbidden', 'Your role in this studio does not allow this.');
  }
  return { ...signedIn, studio };
}

/** Whether locals carry any of the roles (for showing or hiding UI). */
export function hasRole(locals: Locals, allowed: readonly Role[]): boolean {
  return !!locals.studio?.roles.some((r) => allowed.includes(r));
}

/** Where each person lands after signing in. */
export function homePath(locals: Pick<Locals, 'studio'>): string {
  const roles = locals.studio?.roles ?? [];
  if (roles.includes('owner')) return '/studio';
  if (roles.includes('coach') || roles.includes('editor')) return '/studio/classes';
  return '/library';
}

/**
 * For pages: the signed-in studio user, or what to do instead (send to sign-in, or show 403).
 */
export function guardPage(
  locals: Locals,
  allowed: readonly Role[],
): { ok: true; access: InStudio } | { ok: false; reason: 'sign-in' | 'forbidden' } {
  if (!locals.user || !locals.session) return { ok: false, reason: 'sign-in' };
  if (!locals.studio || !locals.studio.roles.some((r) => allowed.includes(r))) return { ok: false, reason: 'forbidden' };
  return { ok: true, access: { user: locals.user, session: locals.session, studio: locals.studio } };
}
