import type { ApiClient } from './api-client';

/**
 * Fetches a recording file as a browser does: the app checks access and redirects to a signed
 * storage URL, which the browser then fetches without the app's cookie.
 */
export async function fetchMedia(c: ApiClient, path: string, headers: Record<string, string> = {}): Promise<Response> {
  const res = await c.request('GET', path, undefined, headers);
  if (res.status !== 302) return res;
  return fetch(res.headers.get('location')!, { headers });
}

/** The object store's address, as signed media URLs name it. */
export const STORE_ORIGIN = new URL(process.env.S3_ENDPOINT ?? `http://127.0.0.1:${process.env.ROUNDMARK_S3_PORT ?? 4569}`).origin;
