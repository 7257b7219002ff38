/**
 * Headers on every answer. Sources: MDN/OWASP Secure Headers Project for X-Content-Type-Options
 * nosniff and Referrer-Policy strict-origin-when-cross-origin; CSP Level 2 `frame-ancestors 'none'`
 * (W3C) against framing; RFC 9111 §5.2.2.3/§5.2.2.7 for `no-store` and `private`.
 */
import { describe, expect, it } from 'vitest';
import { ApiClient, DEMO, signedIn } from '../helpers/api-client';

describe('security headers', () => {
  it.each([
    ['a public page', '/sign-in', false],
    ['an API answer', '/api/health', false],
    ['a signed-in page', '/library', true],
    ['a personal API answer', '/api/me', true],
  ])('%s carries nosniff, the referrer policy and frame-ancestors none', async (_what, path, signIn) => {
    const c = signIn ? await signedIn(DEMO.member) : new ApiClient();
    const res = await c.get(path);
    await res.arrayBuffer();
    expect(res.status).toBeLessThan(400);
    expect(res.headers.get('x-content-type-options')).toBe('nosniff');
    expect(res.headers.get('referrer-policy')).toBe('strict-origin-when-cross-origin');
    expect(res.headers.get('content-security-policy')).toMatch(/frame-ancestors 'none'/);
    if (signIn) expect(res.headers.get('cache-control')).toMatch(/no-store/);
  });
});
