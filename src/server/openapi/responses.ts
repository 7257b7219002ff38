import type { z } from 'zod';
import { errorOutput } from '~/lib/api/error-schemas';

const ERROR_TEXT: Record<number, string> = {
  400: 'Invalid input; `fields` names each problem',
  401: 'Not signed in',
  403: 'Signed in, but the role does not allow this',
  404: 'Not found (also for another studio’s data)',
  409: 'Conflict: a stale version, or the current state does not allow this',
  413: 'Too large',
  415: 'Unsupported file type',
  422: 'Well-formed, but something it needs is missing (the message says what)',
  429: 'Too many attempts; see Retry-After',
  503: 'A dependency is down',
};

/** A JSON response description for a route config. */
export const json = (schema: z.ZodType, description: string) => ({ description, content: { 'application/json': { schema } } });

/** The error responses a route can give, all with the shared error body. */
export const errors = (...codes: number[]) =>
  Object.fromEntries(codes.map((c) => [String(c), json(errorOutput, ERROR_TEXT[c] ?? `Error ${c}`)]));
