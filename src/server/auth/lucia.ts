import { Lucia, TimeSpan } from 'lucia';
import { DrizzlePostgreSQLAdapter } from '@lucia-auth/adapter-drizzle';
import { sessions, users } from '~/db/schema';
import type { Db } from '../db';

// All of lucia lives in this module (its authors stopped developing it in 2025), so a
// replacement only has to offer these few functions.

/** Builds the session manager for a database. Over HTTPS cookies are Secure with a __Host- name (ASVS 3.4.4). */
export function createLucia(db: Db, secure: boolean) {
  return new Lucia(new DrizzlePostgreSQLAdapter(db, sessions, users), {
    // Sessions last 30 days and lucia extends them when used in their second half.
    sessionExpiresIn: new TimeSpan(30, 'd'),
    sessionCookie: {
      name: secure ? '__Host-rm_session' : 'rm_session',
      attributes: { secure, sameSite: 'lax', path: '/' },
    },
    // The session check already reads the user row, so pages need no second query for these.
    getUserAttributes: (attrs) => ({ email: attrs.email, name: attrs.name, emailVerified: attrs.emailVerifiedAt != null }),
  });
}

export type Auth = ReturnType<typeof createLucia>;

declare module 'lucia' {
  interface Register {
    Lucia: Auth;
    DatabaseUserAttributes: { email: string; name: string; emailVerifiedAt: Date | null };
  }
}
