/** Failures of the services the app depends on (database, object store), as errors people can act on. */
import { AppError } from './errors';

/**
 * Errors that mean "the database cannot be reached right now" rather than "this request is
 * wrong": refused or dropped connections, a server shutting down or starting up (PostgreSQL
 * SQLSTATE class 08 and 57P01–57P03, PostgreSQL 15 docs, Appendix A), and node-postgres's own
 * messages for a connection that ended or could not be made in time.
 */
const NETWORK_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH', 'ENOTFOUND', 'EAI_AGAIN']);
const SQLSTATES = new Set(['57P01', '57P02', '57P03', '08000', '08001', '08003', '08004', '08006']);
const MESSAGES = /Connection terminated|timeout exceeded when trying to connect|Client has encountered a connection error|Client was closed|the database system is (starting up|shutting down)/i;

/** A refused, reset or timed-out connection anywhere in the error's causes (any service). */
export function isConnectionFailure(err: unknown): boolean {
  for (let e = err, depth = 0; e && depth < 5; depth++) {
    const { code, name, cause, errors } = e as { code?: unknown; name?: unknown; cause?: unknown; errors?: unknown };
    if (typeof code === 'string' && NETWORK_CODES.has(code)) return true;
    if (name === 'TimeoutError') return true;
    if (Array.isArray(errors) && errors.some(isConnectionFailure)) return true;
    e = cause;
  }
  return false;
}

export function isDatabaseUnavailable(err: unknown): boolean {
  // Drizzle wraps the driver's error in `cause`; an AggregateError lists one per address tried.
  for (let e = err, depth = 0; e && depth < 5; depth++) {
    const { code, message, cause, errors } = e as { code?: unknown; message?: unknown; cause?: unknown; errors?: unknown };
    if (typeof code === 'string' && (NETWORK_CODES.has(code) || SQLSTATES.has(code))) return true;
    if (typeof message === 'string' && MESSAGES.test(message)) return true;
    if (Array.isArray(errors) && errors.some(isDatabaseUnavailable)) return true;
    e = cause;
  }
  return false;
}

/** What a person sees while the database is away: nothing was changed, and when to try again. */
export const databaseUnavailable = () =>
  new AppError('unavailable', 'Roundmark cannot reach its database right now, so nothing was changed. Please try again in a minute.', undefined, {
    retryAfterSeconds: 30,
  });

/** What a person sees while the object store is away (media, uploads). */
export const storeUnavailable = () =>
  new AppError('unavailable', 'The media store cannot be reached right now. Nothing was changed; please try again in a minute.', undefined, {
    retryAfterSeconds: 30,
  });
