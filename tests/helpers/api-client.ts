/**
 * A small HTTP client for tests: keeps the session cookie and sends the Origin header Astro checks.
 * Every answer from /api/** is held to the OpenAPI document (tests/helpers/openapi-contract.ts):
 * an undocumented status or a body that does not match its schema fails the test.
 */
import { appendFileSync } from 'node:fs';
import { assertDocumentedResponse } from './openapi-contract';

export const BASE = () => process.env.TEST_BASE_URL ?? `http://127.0.0.1:${process.env.ROUNDMARK_TEST_PORT ?? '4399'}`;
export const DEMO_PASSWORD = 'fernhill-demo-2026'; // demo data, printed in the README

/**
 * A made-up client address from 198.18.0.0/15 (RFC 2544's benchmarking range). The test app
 * trusts loopback as its reverse proxy (tests/helpers/app-server.ts), so each client arrives
 * "from" its own address and per-address rate limits keep tests apart, as real people would be.
 */
export const randomClientAddress = () =>
  `198.${18 + Math.floor(Math.random() * 2)}.${Math.floor(Math.random() * 256)}.${1 + Math.floor(Math.random() * 254)}`;

export class ApiClient {
  cookie = '';
  /** Sent as X-Forwarded-For, as the proxy in front of the app would add it. */
  address = randomClientAddress();
  /** When set, an answer the OpenAPI document does not describe is handed here instead of thrown (the fuzz test counts them all). */
  onContractError?: (e: unknown) => void;

  async request(method: string, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<Response> {
    const isText = typeof body === 'string';
    // Bytes (a file's content) are sent as they are.
    const isBytes = body instanceof Uint8Array;
    const res = await fetch(BASE() + path, {
      method,
      redirect: 'manual',
      headers: {
        origin: BASE(),
        'x-forwarded-for': this.address,
        ...(body !== undefined ? { 'content-type': isBytes ? 'application/octet-stream' : isText ? 'text/plain' : 'application/json' } : {}),
        ...(this.cookie ? { cookie: this.cookie } : {}),
        ...headers,
      },
      body: body === undefined ? undefined : isText || isBytes ? (body as BodyInit) : JSON.stringify(body),
    });
    for (const c of res.headers.getSetCookie()) {
      const pair = c.split(';')[0]!;
      this.cookie = pair.endsWith('=') ? '' : pair;
    }
    await assertDocumentedResponse(BASE(), method, path, res).catch((e: unknown) => {
      if (this.onContractError) return this.onContractError(e);
      // CONTRACT_REPORT=<file> lists every mismatch of a run instead of stopping at the first (for surveying drift).
      if (!process.env.CONTRACT_REPORT) throw e;
      appendFileSync(process.env.CONTRACT_REPORT, `${e instanceof Error ? e.message : String(e)}\n---\n`);
    });
    return res;
  }

  get = (path: string) => this.request('GET', path);
  post = (path: string, body?: unknown) => this.request('POST', path, body);
  put = (path: string, body?: unknown) => this.request('PUT', path, body);
  patch = (path: string, body?: unknown) => this.request('PATCH', path, body);
  del = (path: string) => this.request('DELETE', path);

  /**
   * Signs up through the API, then signs in (sign-up answers 202 without a session, the same for
   * every address); answers the new account's id.
   */
  async signUpAndIn(account: { name: string; email: string; password: string }): Promise<string> {
    const res = await this.post('/api/auth/sign-up', account);
    if (res.status !== 202) throw new Error(`sign-up failed: ${res.status} ${await res.text()}`);
    const signedIn = await this.signIn(account.email, account.password);
    if (signedIn.status !== 200) throw new Error(`sign-in after sign-up failed: ${signedIn.status} ${await signedIn.text()}`);
    return ((await signedIn.json()) as { userId: string }).userId;
  }

  /** Signs in through the API and keeps the cookie. */
  async signIn(email: string, password = DEMO_PASSWORD): Promise<Response> {
    return this.post('/api/auth/sign-in', { email, password });
  }
}

/** A client signed in as a demo person. */
export async function signedIn(email: string): Promise<ApiClient> {
  const c = new ApiClient();
  const res = await c.signIn(email);
  if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${await res.text()}`);
  return c;
}

/** The demo people by role (demo data from ../shared/design.md). */
export const DEMO = {
  owner: 'ada@fernhill.example',
  coach: 'tomasz@fernhill.example',
  editor: 'priya@fernhill.example',
  member: 'sam@fernhill.example',
} as const;
