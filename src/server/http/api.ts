import type { z } from 'zod';
import { AppError } from '../errors';
import { databaseUnavailable, isDatabaseUnavailable } from '../unavailable';
import { statusOf } from './error-status';
import { MAX_TIMELINE_FILE_BYTES } from '~/lib/api/timeline-file-schemas';
import { MAX_COVER_UPLOAD_BYTES } from '~/lib/publishing/cover';
import { MAX_LOGO_UPLOAD_BYTES } from '~/lib/studios/studio-logo';

/** A JSON response. */
/**
 * A JSON answer typed by the output schema the OpenAPI document shows for it, so TypeScript
 * catches a body that drifts from the document (the integration tests check the rest).
 */
export function answer<S extends z.ZodType>(schema: S, data: z.output<S>, status = 200, headers: HeadersInit = {}): Response {
  void schema; // only its type is used: outputs are not parsed again at run time
  return json(data, status, headers);
}

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

/** Largest JSON body any endpoint reads (1 MiB); a whole 3-hour timeline is about 500 KB. */
export const JSON_BODY_LIMIT = 1024 * 1024;

/**
 * The body limit of a path: timeline imports take files up to MAX_TIMELINE_FILE_BYTES (2 MiB), cover
 * uploads MAX_COVER_UPLOAD_BYTES (5 MiB), studio logos MAX_LOGO_UPLOAD_BYTES (2 MiB), everything else JSON_BODY_LIMIT. The middleware refuses a larger Content-Length on any route
 * (pages' forms included) before anything reads the body.
 */
export const bodyLimitFor = (pathname: string) =>
  /^\/api\/lessons\/[^/]+\/timeline\/import\/?$/.test(pathname)
    ? MAX_TIMELINE_FILE_BYTES
    : /^\/api\/lessons\/[^/]+\/cover\/upload\/?$/.test(pathname)
      ? MAX_COVER_UPLOAD_BYTES
      : /^\/api\/studios\/[^/]+\/logo\/?$/.test(pathname) || /^\/_actions\/uploadStudioLogo\/?$/.test(pathname) || pathname === '/studio/settings'
        ? MAX_LOGO_UPLOAD_BYTES + 64 * 1024 // the form's multipart framing around the file
        : JSON_BODY_LIMIT;

export const tooLarge = (limit: number) =>
  new AppError('too_large', `The request body is larger than ${formatBytes(limit)}, so it was not read. Send less at once.`, undefined, { limitBytes: limit });
const formatBytes = (n: number) => (n >= 1024 * 1024 ? `${+(n / 1024 / 1024).toFixed(1)} MB` : `${Math.ceil(n / 1024)} KB`);

/**
 * Reads a request body, refusing more than `limit` bytes with 413 (too_large): at once when
 * Content-Length says so, before a byte is read, and otherwise (chunked uploads) by counting while
 * it streams and stopping at the limit, so an oversize body is never held in memory.
 */
export async function readBodyBytes(request: Request, limit = JSON_BODY_LIMIT): Promise<Uint8Array> {
  const declared = request.headers.get('content-length');
  if (declared !== null && Number(declared) > limit) throw tooLarge(limit);
  if (!request.body) return new Uint8Array();
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > limit) {
      await discardRest(reader, total);
      throw tooLarge(limit);
    }
    chunks.push(value);
  }
  const bytes = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    bytes.set(c, at);
    at += c.byteLength;
  }
  return bytes;
}

/** Reads a request body as UTF-8 text within `limit` bytes (see readBodyBytes). */
export async function readBodyText(request: Request, limit = JSON_BODY_LIMIT): Promise<string> {
  return new TextDecoder().decode(await readBodyBytes(request, limit));
}

/**
 * After a chunked body passed its limit: reads and drops what the client is still sending, so it
 * gets to read the 413 instead of a reset connection (Express's error handler does the same), but
 * never more than DRAIN_LIMIT in all; past that the connection is cut. Common practice, no source.
 */
const DRAIN_LIMIT = 64 * 1024 * 1024;
async function discardRest(reader: ReadableStreamDefaultReader<Uint8Array>, seen: number): Promise<void> {
  for (let total = seen; total <= DRAIN_LIMIT; ) {
    const { done, value } = await reader.read();
    if (done) return;
    total += value.byteLength;
  }
  await reader.cancel().catch(() => {});
}

/** Reads a JSON body (at most `limit` bytes, else 413) and validates it. */
export async function readJson<S extends z.ZodType>(request: Request, schema: S, limit = JSON_BODY_LIMIT): Promise<z.infer<S>> {
  const text = await readBodyText(request, limit);
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    throw new AppError('invalid_input', 'The request body must be JSON.');
  }
  return parseWith(schema, body);
}

/** Headers some error answers need: Retry-After on 429 (RFC 9110 §10.2.3), Content-Range on 416 (§14.4). */
function errorHeaders(err: AppError): Record<string, string> {
  if ((err.code === 'rate_limited' || err.code === 'unavailable') && typeof err.extra?.retryAfterSeconds === 'number') return { 'retry-after': String(err.extra.retryAfterSeconds) };
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
  if (isDatabaseUnavailable(err)) return errorResponse(databaseUnavailable());
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
