import type { ErrorCode } from '../errors';

/** The one place a domain error's code becomes an HTTP status. */
export const ERROR_STATUS: Record<ErrorCode, number> = {
  invalid_input: 400,
  unauthenticated: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  unprocessable: 422,
  too_large: 413,
  unsupported_media: 415,
  range_not_satisfiable: 416,
  rate_limited: 429,
  unavailable: 503,
};

export const statusOf = (code: ErrorCode): number => ERROR_STATUS[code];
