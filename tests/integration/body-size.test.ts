/**
 * Oversize bodies are refused with 413 before they are read: a declared Content-Length past the
 * limit gets its answer while the body is still unsent, and a chunked body (no Content-Length) is
 * cut off once the count passes the limit. JSON: 1 MiB; timeline imports: 2 MiB (README).
 */
import { request as httpRequest } from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BASE, DEMO, signedIn, type ApiClient } from '../helpers/api-client';

const MiB = 1024 * 1024;
let coach: ApiClient;
let lessonId: string;

beforeAll(async () => {
  coach = await signedIn(DEMO.coach);
  lessonId = (await (await coach.post('/api/lessons', { title: `Body size ${Date.now()}`, advertisedMinutes: 10 })).json()).id;
});
afterAll(() => {});

/** Sends only the headers of a request that announces `length` bytes and waits for the answer. */
function announceOnly(path: string, length: number, headers: Record<string, string> = {}): Promise<{ status: number; body: string }> {
  return new Promise((resolve, reject) => {
    const req = httpRequest(BASE() + path, {
      method: 'POST',
      headers: { origin: BASE(), 'content-type': 'application/json', 'content-length': String(length), ...headers },
    });
    req.on('response', (res) => {
      let body = '';
      res.setEncoding('utf8');
      res.on('data', (c) => (body += c));
      res.on('end', () => {
        resolve({ status: res.statusCode!, body });
        req.destroy();
      });
    });
    req.on('error', reject);
    req.flushHeaders(); // the body never follows: an answer proves nothing waited for it
  });
}

/** A chunked body (no Content-Length) of `size` bytes of JSON-ish text. */
function chunked(size: number): ReadableStream<Uint8Array> {
  const chunk = new TextEncoder().encode('x'.repeat(64 * 1024));
  let sent = 0;
  return new ReadableStream({
    pull(controller) {
      if (sent === 0) controller.enqueue(new TextEncoder().encode('{"email":"'));
      if (sent >= size) return controller.close();
      controller.enqueue(chunk);
      sent += chunk.byteLength;
    },
  });
}

describe('body size', () => {
  it('answers 413 to an anonymous 50 MB JSON sign-in before reading the body', async () => {
    const res = await announceOnly('/api/auth/sign-in', 50 * 1000 * 1000);
    expect(res.status).toBe(413);
    expect(JSON.parse(res.body).error).toMatchObject({ code: 'too_large', message: expect.stringMatching(/larger than 1 MB/) });
  });

  it('answers 413 to a chunked JSON body once it passes 1 MiB', async () => {
    const res = await fetch(BASE() + '/api/auth/sign-in', {
      method: 'POST',
      headers: { origin: BASE(), 'content-type': 'application/json' },
      body: chunked(3 * MiB),
      duplex: 'half',
    } as RequestInit & { duplex: 'half' });
    expect(res.status).toBe(413);
    expect((await res.json()).error.code).toBe('too_large');
  });

  it('still reads a JSON body just under the limit (and answers for its content)', async () => {
    const res = await coach.post('/api/lessons', { title: 'x', advertisedMinutes: 10, description: 'y'.repeat(MiB - 200) });
    expect(res.status).toBe(400); // read and validated: the description is too long, not the body
    expect((await res.json()).error.fields.description).toMatch(/4,000 characters/);
  });

  it('allows timeline imports up to 2 MiB and refuses more, declared or chunked', async () => {
    const declared = await announceOnly(`/api/lessons/${lessonId}/timeline/import?version=0`, 2 * MiB + 1, { cookie: coach.cookie, 'content-type': 'text/csv' });
    expect(declared.status).toBe(413);
    expect(JSON.parse(declared.body).error.message).toMatch(/larger than 2 MB/);
    const big = await fetch(`${BASE()}/api/lessons/${lessonId}/timeline/import?version=0`, {
      method: 'POST',
      headers: { origin: BASE(), cookie: coach.cookie, 'content-type': 'text/csv' },
      body: chunked(3 * MiB),
      duplex: 'half',
    } as RequestInit & { duplex: 'half' });
    expect(big.status).toBe(413);
    // 1.5 MB is over the JSON limit but within the import limit: read, then refused for its content.
    const within = await coach.request('POST', `/api/lessons/${lessonId}/timeline/import?version=0&format=csv`, 'x'.repeat(1.5 * MiB), { 'content-type': 'text/csv' });
    expect(within.status).toBe(400);
  });

  it('refuses an oversize form post to a page with 413', async () => {
    const res = await announceOnly('/sign-in', 5 * MiB, { 'content-type': 'application/x-www-form-urlencoded' });
    expect(res.status).toBe(413);
  });
});
