/**
 * Domain errors: what went wrong, in words the user can act on, with a code that says which
 * kind of failure it is. Services and use cases throw them; they know nothing about HTTP. Only
 * the web layer (src/server/http/error-status.ts) turns a code into a status.
 */
export const ERROR_CODES = [
  'invalid_input',
  'unauthenticated',
  'forbidden',
  'not_found',
  'conflict',
  /** Well-formed, but the thing it needs is missing (e.g. a proposal for a class without a plan). */
  'unprocessable',
  'too_large',
  'unsupported_media',
  'range_not_satisfiable',
  'rate_limited',
  'unavailable',
] as const;

export type ErrorCode = (typeof ERROR_CODES)[number];

/** A failure the user can act on; `fields` names bad inputs, `extra` carries details for the answer body. */
export class AppError extends Error {
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly fields?: Record<string, string>,
    readonly extra?: Record<string, unknown>,
  ) {
    super(message);
  }
}

export const notFound = (what = 'That page') =>
  new AppError('not_found', `${what} could not be found. It may have moved, or you may not have access.`);

/** True for a domain error of that code (pages use it to answer 404 instead of rendering). */
export const isError = (err: unknown, code: ErrorCode): err is AppError => err instanceof AppError && err.code === code;
