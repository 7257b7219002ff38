import { createHash } from 'node:crypto';
import { generateIdFromEntropySize, Lucia, TimeSpan, type Session } from 'lucia';
import { DrizzlePostgreSQLAdapter } from '@lucia-auth/adapter-drizzle';
import { sessions, users } from '~/db/schema';
import type { Db } from '../db';

// All of lucia lives in this module (its authors stopped developing it in 2025), so a
// replacement only has to offer these few functions.

function createLucia(db: Db, secure: boolean) {
  return new Lucia(new DrizzlePostgreSQLAdapter(db, sessions, users), {
    // Sessions last 30 days and lucia extends them when used in their second half.
    sessionExpiresIn: new TimeSpan(30, 'd'),
    sessionCookie: {
      name: secure ? '__Host-rm_session' : 'rm_session',
      attributes: { secure, sameSite: 'lax', path: '/' },
    },
    // The session check already reads the user row, so pages need no second query for these.
    // The studio chosen in this session rides along with the session check (no second query).
    getSessionAttributes: (attrs) => ({ currentStudioId: attrs.currentStudioId }),
    getUserAttributes: (attrs) => ({ email: attrs.email, name: attrs.name, emailVerified: attrs.emailVerifiedAt != null }),
  });
}

/**
 * The database keeps only the SHA-256 of a session's token (hex), never the token itself, so a
 * leaked copy of the sessions table signs nobody in (issue 15, point 8). lucia 3 takes the id we
 * choose at creation and looks sessions up by id, so the cookie carries the token and every lookup
 * hashes it first.
 */
export const sessionIdOf = (token: string): string => createHash('sha256').update(token).digest('hex');

/** A new account's id (random, 80 bits, as lucia suggests for user ids). */
export const newUserId = (): string => generateIdFromEntropySize(10);

/** A session just opened, with the token that goes in the cookie (only here, never stored). */
export type NewSession = Session & { token: string };

/**
 * Builds the session manager for a database. Over HTTPS cookies are Secure with a __Host- name
 * (ASVS 3.4.4). Methods taking a token (the cookie's value) hash it; methods taking a session id
 * take the stored one (`locals.session.id`).
 */
export function createAuth(db: Db, secure: boolean) {
  const lucia = createLucia(db, secure);
  return {
    sessionCookieName: lucia.sessionCookieName,
    /** A new session with a fresh 200-bit token (ASVS 3.2.2 asks for at least 64 bits). */
    async createSession(userId: string, currentStudioId: string | null = null): Promise<NewSession> {
      const token = generateIdFromEntropySize(25);
      const session = await lucia.createSession(userId, { currentStudioId }, { sessionId: sessionIdOf(token) });
      return { ...session, token };
    },
    /** The session and user for a cookie's token; lucia extends the session in its second half (`fresh`). */
    validateSession: (token: string) => lucia.validateSession(sessionIdOf(token)),
    createSessionCookie: (token: string) => lucia.createSessionCookie(token),
    createBlankSessionCookie: () => lucia.createBlankSessionCookie(),
    invalidateSession: (sessionId: string) => lucia.invalidateSession(sessionId),
    invalidateUserSessions: (userId: string) => lucia.invalidateUserSessions(userId),
  };
}

export type Auth = ReturnType<typeof createAuth>;

declare module 'lucia' {
  interface Register {
    Lucia: ReturnType<typeof createLucia>;
    DatabaseUserAttributes: { email: string; name: string; emailVerifiedAt: Date | null };
    DatabaseSessionAttributes: { currentStudioId: string | null };
  }
}
