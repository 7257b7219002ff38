import { RateLimiterPostgres } from 'rate-limiter-flexible';
import type pg from 'pg';
import { createDb, type Db } from './db';
import { createAuth, type Auth } from './auth/lucia';
import { env, settings } from './env';
import { ACCESS_CHANNEL, LibraryCache } from './library-cache';
import { queue, sendJob, type JobName, type JobPayloads } from './queue';

/** The side-effecting parts one process shares; services receive what they need from it. */
export interface AppDeps {
  db: Db;
  pool: pg.Pool;
  auth: Auth;
  limits: SignInLimits;
  studioSlug: string;
  /** Queues follow-up work for the worker; use cases send their own jobs through it. */
  jobs: JobSender;
  /** Shared library pages and filter values; only the web server's own deps have one. */
  libraryCache?: LibraryCache;
  /** Media access decisions per person and recording (30 s at most, dropped when access changes). */
  accessCache?: LibraryCache;
}

export type JobSender = <N extends JobName>(name: N, data: JobPayloads[N], key?: string) => Promise<void>;

/** Sends through the process-wide queue, started on the first job (most requests send none). */
function queueSender(databaseUrl: string): JobSender {
  return async (name, data, key) => {
    await sendJob(await queue(databaseUrl), name, data, key);
  };
}

export interface SignInLimits {
  perAccount: RateLimiterPostgres;
  perAddress: RateLimiterPostgres;
  /** Sign-ups per e-mail address typed and per client address (every attempt counts). */
  signUpPerAccount: RateLimiterPostgres;
  signUpPerAddress: RateLimiterPostgres;
  /** Password-reset requests per e-mail address typed and per client address (every attempt counts). */
  resetPerAccount: RateLimiterPostgres;
  resetPerAddress: RateLimiterPostgres;
}

// Failed sign-ins allowed before a pause: 5 per account and 30 per address in 15 minutes.
// Common practice, no source (OWASP's Authentication Cheat Sheet asks for a limit without fixing numbers).
export const SIGN_IN_LIMITS = {
  account: { points: 5, duration: 15 * 60 },
  address: { points: 30, duration: 15 * 60 },
};

// Requests that send mail or create accounts, counted whether they succeed or not, so the forms
// cannot flood an inbox or fill the database. Common practice, no source.
export const SIGN_UP_LIMITS = {
  account: { points: 3, duration: 60 * 60 },
  address: { points: 10, duration: 60 * 60 },
};
export const RESET_LIMITS = {
  account: { points: 5, duration: 15 * 60 },
  address: { points: 20, duration: 15 * 60 },
};

function signInLimits(pool: pg.Pool): SignInLimits {
  const common = { storeClient: pool, tableName: 'rate_limits', tableCreated: true, clearExpiredByTimeout: false };
  return {
    perAccount: new RateLimiterPostgres({ ...common, keyPrefix: 'signin-account', ...SIGN_IN_LIMITS.account }),
    perAddress: new RateLimiterPostgres({ ...common, keyPrefix: 'signin-address', ...SIGN_IN_LIMITS.address }),
    signUpPerAccount: new RateLimiterPostgres({ ...common, keyPrefix: 'signup-account', ...SIGN_UP_LIMITS.account }),
    signUpPerAddress: new RateLimiterPostgres({ ...common, keyPrefix: 'signup-address', ...SIGN_UP_LIMITS.address }),
    resetPerAccount: new RateLimiterPostgres({ ...common, keyPrefix: 'reset-account', ...RESET_LIMITS.account }),
    resetPerAddress: new RateLimiterPostgres({ ...common, keyPrefix: 'reset-address', ...RESET_LIMITS.address }),
  };
}

/**
 * Builds the dependencies for one database (tests build their own against the test database).
 * `secureCookies` is on whenever the app is served over HTTPS.
 */
export function createAppDeps(databaseUrl: string, secureCookies = false): AppDeps {
  const { db, pool } = createDb(databaseUrl);
  return {
    db,
    pool,
    auth: createAuth(db, secureCookies),
    limits: signInLimits(pool),
    jobs: queueSender(databaseUrl),
    studioSlug: settings().STUDIO_SLUG,
  };
}

let shared: AppDeps | undefined;

/** The process-wide dependencies, built on first use from the environment. */
export function app(): AppDeps {
  if (!shared) {
    shared = createAppDeps(env().DATABASE_URL, env().PUBLIC_BASE_URL.startsWith('https://'));
    shared.libraryCache = new LibraryCache({ connectionString: env().DATABASE_URL });
    shared.accessCache = new LibraryCache({ connectionString: env().DATABASE_URL }, 30_000, ACCESS_CHANNEL);
  }
  return shared;
}
