/**
 * Headers on every answer. Sources: MDN/OWASP Secure Headers Project for X-Content-Type-Options
 * nosniff and Referrer-Policy strict-origin-when-cross-origin; W3C Content Security Policy Level 3
 * for the policy (`frame-ancestors 'none'` against framing, hash-sources for inline scripts);
 * RFC 9111 §5.2.2.3/§5.2.2.7 for `no-store` and `private`.
 */
import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { ApiClient, DEMO, signedIn } from '../helpers/api-client';
import { ensureDeskBreakPublished } from '../helpers/demo-class';

/** The directives of a policy, by name (CSP Level 3 §2.2.1: a name, then its sources). */
const directives = (policy: string | null) =>
  new Map((policy ?? '').split(';').map((d) => d.trim().split(/\s+/)).filter(([n]) => n).map(([n, ...s]) => [n!, s]));

const storeOrigin = () => new URL(process.env.S3_ENDPOINT ?? `http://127.0.0.1:${process.env.ROUNDMARK_S3_PORT}`).origin;

describe('security headers', () => {
  it.each([
    ['a public page', '/sign-in', false],
    ['an API answer', '/api/health', false],
    ['a signed-in page', '/s/fernhill/library', true],
    ['a personal API answer', '/api/me', true],
    ['a refused route id', '/api/lessons/not-a-uuid', false],
  ])('%s carries nosniff, the referrer policy and the full policy', async (_what, path, signIn) => {
    const c = signIn ? await signedIn(DEMO.member) : new ApiClient();
    const res = await c.get(path);
    await res.arrayBuffer();
    expect(res.headers.get('x-content-type-options')).toBe('nosniff');
    expect(res.headers.get('referrer-policy')).toBe('strict-origin-when-cross-origin');
    const d = directives(res.headers.get('content-security-policy'));
    expect(d.get('frame-ancestors')).toEqual(["'none'"]);
    expect(d.get('object-src')).toEqual(["'none'"]);
    expect(d.get('base-uri')).toEqual(["'self'"]);
    expect(d.get('form-action')?.[0]).toBe("'self'");
    expect(d.get('default-src')).toEqual(["'self'"]);
    expect(d.get('script-src')?.[0]).toBe("'self'");
    expect(d.get('script-src')).not.toContain("'unsafe-inline'");
    expect(d.get('script-src')).not.toContain("'unsafe-eval'");
    // Media, posters and peaks are presigned URLs of the object store; hls.js plays through MSE (blob:) and a worker.
    expect(d.get('media-src')).toEqual(["'self'", 'blob:', storeOrigin()]);
    expect(d.get('connect-src')).toEqual(["'self'", storeOrigin()]);
    expect(d.get('worker-src')).toEqual(["'self'", 'blob:']);
    if (signIn) expect(res.headers.get('cache-control')).toMatch(/no-store/);
  });

  it('a page with islands allows exactly its inline scripts, by SHA-256 hash', async () => {
    await ensureDeskBreakPublished();
    const member = await signedIn(DEMO.member);
    const res = await member.get('/s/fernhill/classes/desk-break-mobility');
    const html = await res.text();
    const allowed = directives(res.headers.get('content-security-policy')).get('script-src') ?? [];
    // Inline scripts that run (not JSON-LD data blocks, which CSP does not govern).
    const inline = [...html.matchAll(/<script(?![^>]*\bsrc=)([^>]*)>([\s\S]*?)<\/script>/g)].filter(([, attrs]) => !/type="application\/ld\+json"/.test(attrs!));
    expect(inline.length).toBeGreaterThan(0); // the island bootstrap Astro writes
    for (const [, , body] of inline) {
      // CSP Level 3 §6.7.2.3 (hash-source): base64 of the digest of the script's text as UTF-8.
      const hash = `'sha256-${createHash('sha256').update(body!, 'utf8').digest('base64')}'`;
      expect(allowed, body!.slice(0, 80)).toContain(hash);
    }
    // The demo class may still be generating its recording (up to the helper's 5-minute deadline).
  }, 360_000);
});
