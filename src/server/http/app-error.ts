/** Error codes the API answers with; each maps to one HTTP status. */
export const ERROR_STATUS = {
  invalid_input: 400,
  unauthenticated: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  too_large: 413,
  unsupported_media: 415,
  rate_limited: 429,
  unavailable: 503,
} as const;

export type ErrorCode = keyof typeof ERROR_STATUS;

/**
 * A failure the user can act on. Services throw it; API routes turn it into
 * `{ error: { code, message, fields? } }` and pages show the message.
 */
export class AppError extends Error {
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly fields?: Record<string, string>,
    readonly extra?: Record<string, unknown>,
  ) {
    super(message);
  }

  get status(): number {
    return ERROR_STATUS[this.code];
  }
}

export const notFound = (what = 'That page') =>
  new AppError('not_found', `${what} could not be found. It may have moved, or you may not have access.`);
