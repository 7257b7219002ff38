/**
 * How the production server (dist/serve.mjs, which this test app runs) sends the client files
 * and pages: scripts from the Brotli or gzip copy the build wrote, as the browser accepts, kept by
 * browsers for a year under their hashed names; pages compressed on the fly; a malformed path
 * answered 400 before anything else looks at it.
 */
import { describe, expect, it } from 'vitest';
import http from 'node:http';
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';

const base = process.env.TEST_BASE_URL!;
const dist = process.env.ROUNDMARK_DIST ?? 'dist';

/** One GET with raw bytes as sent (fetch would decode them and choose its own Accept-Encoding). */
function rawGet(urlPath: string, acceptEncoding: string): Promise<{ status: number; headers: http.IncomingHttpHeaders; body: Buffer }> {
  return new Promise((resolve, reject) => {
    http
      .get(base + urlPath, { headers: { 'accept-encoding': acceptEncoding } }, (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }));
      })
      .on('error', reject);
  });
}

/** The largest script of the build: the one where the saving matters most. */
function largestScript(): string {
  const dir = path.join(dist, 'client/_astro');
  const name = readdirSync(dir)
    .filter((f) => f.endsWith('.js'))
    .sort((a, b) => statSync(path.join(dir, b)).size - statSync(path.join(dir, a)).size)[0]!;
  return `/_astro/${name}`;
}

describe('served files', () => {
  it('runs the compiled server the build wrote', () => {
    expect(existsSync(path.join(dist, 'serve.mjs'))).toBe(true);
  });

  it('sends a script as its Brotli copy, its gzip copy, or plain, as the browser accepts', async () => {
    const file = largestScript();
    const original = readFileSync(path.join(dist, 'client', file));

    const br = await rawGet(file, 'gzip, deflate, br');
    expect(br.status).toBe(200);
    expect(br.headers['content-encoding']).toBe('br');
    expect(br.headers.vary).toMatch(/accept-encoding/i);
    expect(br.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(br.body.length).toBeLessThan(original.length / 2);
    expect(zlib.brotliDecompressSync(br.body).equals(original)).toBe(true);

    const gz = await rawGet(file, 'gzip');
    expect(gz.headers['content-encoding']).toBe('gzip');
    expect(zlib.gunzipSync(gz.body).equals(original)).toBe(true);
    // The build's Brotli (quality 11) beats gzip: the reason to precompress at all.
    expect(br.body.length).toBeLessThan(gz.body.length);

    const plain = await rawGet(file, 'identity');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.body.equals(original)).toBe(true);
  });

  it('answers a repeated request for an unchanged script with 304 when the browser names its ETag', async () => {
    const file = largestScript();
    const first = await rawGet(file, 'br');
    const again = await new Promise<number>((resolve, reject) => {
      http
        .get(base + file, { headers: { 'accept-encoding': 'br', 'if-none-match': String(first.headers.etag) } }, (res) => {
          res.resume();
          resolve(res.statusCode ?? 0);
        })
        .on('error', reject);
    });
    expect(again).toBe(304);
  });

  it('compresses pages on the fly and leaves other public files revalidated hourly', async () => {
    const page = await rawGet('/sign-in', 'br');
    expect(page.status).toBe(200);
    expect(page.headers['content-encoding']).toBe('br');
    expect(zlib.brotliDecompressSync(page.body).toString('utf8')).toContain('</html>');

    const icon = await rawGet('/favicon.svg', 'identity');
    expect(icon.status).toBe(200);
    expect(icon.headers['cache-control']).toBe('public, max-age=3600');
  });

  it('answers a path that is not valid percent-encoding with 400, and an unknown path with the 404 page', async () => {
    expect((await rawGet('/%E0%A4%A', 'identity')).status).toBe(400);
    const missing = await rawGet('/no-such-page', 'identity');
    expect(missing.status).toBe(404);
    expect(missing.body.toString('utf8')).toContain('<html');
  });
});
