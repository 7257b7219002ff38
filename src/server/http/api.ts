import type { z } from 'zod';
import { AppError } from '../errors';
import { statusOf } from './error-status';

/** A JSON response. */
export function json(data: unknown, status = 200, headers: HeadersInit = {}): Response {
  return new Response(JSON.stringify(data), {
    status,
    headers: { 'content-type': 'application/json; charset=utf-8', 'cache-control': 'no-store', ...headers },
  });
}

/** Turns zod issues into `{ field: message }`, first message per field. */
export function fieldErrors(error: z.ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.join('.') || '_';
    fields[key] ??= issue.message;
  }
  return fields;
}

/** Validates data against a schema or throws a 400 AppError naming each bad field. */
export function parseWith<S extends z.ZodType>(schema: S, data: unknown): z.infer<S> {
  const parsed = schema.safeParse(data);
  if (!parsed.success) {
    const fields = fieldErrors(parsed.error);
    const messages = Object.values(fields);
    // One problem: say it outright; several: point at the fields.
    throw new AppError('invalid_input', messages.length === 1 ? messages[0]! : 'Some fields need another look.', fields);
  }
  return parsed.data;
}

/** Reads a JSON body and validates it. */
export async function readJson<S extends z.ZodType>(request: Request, schema: S): Promise<z.infer<S>> {
  let body: unknown;
  try {
    body = await request.json();
  } catch {
    throw new AppError('invalid_input', 'The request body must be JSON.');
  }
  return parseWith(schema, body);
}

/** Headers some error answers need: Retry-After on 429 (RFC 9110 §10.2.3), Content-Range on 416 (§14.4). */
function errorHeaders(err: AppError): Record<string, string> {
  if (err.code === 'rate_limited' && typeof err.extra?.retryAfterSeconds === 'number') return { 'retry-after': String(err.extra.retryAfterSeconds) };
  if (err.code === 'range_not_satisfiable' && typeof err.extra?.size === 'number') return { 'content-range': `bytes */${err.extra.size}` };
  return {};
}

/** Answers an error as `{ error: { code, message, fields? } }`; unknown errors become 500 without details. */
export function errorResponse(err: unknown): Response {
  if (err instanceof AppError) {
    return json(
      { error: { code: err.code, message: err.message, ...(err.fields ? { fields: err.fields } : {}), ...err.extra } },
      statusOf(err.code),
      errorHeaders(err),
    );
  }
  console.error(err);
  return json({ error: { code: 'internal', message: 'Something went wrong on our side. Please try again.' } }, 500);
}

/** Wraps an endpoint so thrown AppErrors become JSON error answers. */
export function endpoint<C>(handler: (ctx: C) => Promise<Response>): (ctx: C) => Promise<Response> {
  return async (ctx) => {
    try {
      return await handler(ctx);
    } catch (err) {
      return errorResponse(err);
    }
  };
}
