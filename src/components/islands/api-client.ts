import type { ErrorOutput } from '~/lib/api/error-schemas';

/**
 * The one small client every island uses for our JSON API (same origin, session cookie).
 * Error answers (`{ error: { code, message, fields? } }`) and network failures become ApiError.
 */
export class ApiError extends Error {
  constructor(
    message: string,
    /** HTTP status, or 0 when the server could not be reached. */
    readonly status: number,
    readonly code: string,
    readonly fields?: Record<string, string>,
    /** The whole error answer, for callers that need more (e.g. a 409's current version). */
    readonly body?: unknown,
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

export interface CallOptions {
  signal?: AbortSignal;
  /** What to say when the server cannot be reached (context-specific: what is kept, what to do). */
  offlineMessage?: string;
  /** What to say when the session has ended. */
  signedOutMessage?: string;
}

/** An error answer, or whatever a proxy in between sent instead (hence everything optional). */
type ErrorBody = { error?: Partial<ErrorOutput['error']> } | null;

/** Sends JSON (or a file's bytes) and answers the parsed body, or throws an ApiError with a message people can act on. */
export async function apiCall<T>(method: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE', path: string, body?: unknown, options: CallOptions = {}): Promise<T> {
  let res: Response;
  try {
    res = await fetch(path, {
      method,
      credentials: 'same-origin',
      // A file (Blob) is sent as its bytes; anything else as JSON.
      headers:
        body === undefined
          ? { accept: 'application/json' }
          : { accept: 'application/json', 'content-type': body instanceof Blob ? body.type || 'application/octet-stream' : 'application/json' },
      body: body === undefined ? undefined : body instanceof Blob ? body : JSON.stringify(body),
      signal: options.signal,
    });
  } catch (err) {
    if (err instanceof DOMException && err.name === 'AbortError') throw err;
    throw new ApiError(options.offlineMessage ?? 'We could not reach Roundmark. Check your connection, then try again.', 0, 'network');
  }
  const data = (await res.json().catch(() => null)) as ErrorBody;
  if (!res.ok) {
    const e = data?.error;
    if (res.status === 401) throw new ApiError(options.signedOutMessage ?? 'Your session has ended. Sign in again, then try again.', 401, 'unauthenticated');
    // With several field problems the top message is general; the first field's own message says what to do.
    const fieldMessage = e?.code === 'invalid_input' && e.fields ? Object.values(e.fields)[0] : undefined;
    throw new ApiError(fieldMessage ?? e?.message ?? `Something went wrong on our side (${res.status}). Please try again.`, res.status, e?.code ?? 'unknown', e?.fields, data);
  }
  return data as T;
}
