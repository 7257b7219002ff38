// Client addresses and the limits keyed on them. The test app runs through src/serve.ts with
// TRUSTED_PROXIES=loopback, so each request here arrives as if through a reverse proxy on
// loopback that appended the real peer's address to X-Forwarded-For.
import { afterAll, describe, expect, it } from 'vitest';
import { ApiClient } from '../helpers/api-client';
import { createAppDeps, RESET_LIMITS, SIGN_IN_LIMITS, SIGN_UP_LIMITS } from '~/server/app';

const deps = createAppDeps(process.env.DATABASE_URL!);
afterAll(() => deps.pool.end());

const unique = () => `person-${Date.now()}-${Math.random().toString(36).slice(2, 8)}@test.example`;
// 203.0.113.0/24 is TEST-NET-3 and 192.0.2.0/24 TEST-NET-1, reserved for documentation (RFC 5737).
const testNet3 = () => `203.0.113.${1 + Math.floor(Math.random() * 254)}`;
const testNet1 = () => `192.0.2.${1 + Math.floor(Math.random() * 254)}`;

/** A client whose proxy saw it at `peer`; `spoofed` is what the client itself claimed before that. */
function behindProxy(peer: string, spoofed?: string): ApiClient {
  const c = new ApiClient();
  c.address = spoofed ? `${spoofed}, ${peer}` : peer;
  return c;
}

describe('client address', () => {
  it('keys the per-address sign-in limit on the right-most untrusted hop, not the value the client sent', async () => {
    const peer = testNet3();
    for (let i = 0; i < SIGN_IN_LIMITS.address.points; i++) {
      // A fresh spoofed left-most value every time: before the fix each one was a new "address".
      const res = await behindProxy(peer, testNet1()).post('/api/auth/sign-in', { email: unique(), password: 'not it at all' });
      expect(res.status).toBe(400);
    }
    const res = await behindProxy(peer, testNet1()).post('/api/auth/sign-in', { email: unique(), password: 'not it at all' });
    expect(res.status).toBe(429);
    // Someone else behind the same proxy is not affected.
    const other = await behindProxy(testNet3() === peer ? '203.0.113.255' : testNet3()).post('/api/auth/sign-in', { email: unique(), password: 'x' });
    expect(other.status).toBe(400);
  });
});

describe('sign-up and password-reset limits', () => {
  it(`allows ${SIGN_UP_LIMITS.address.points} sign-ups an hour from one address, then answers 429 with Retry-After`, async () => {
    const peer = testNet3();
    for (let i = 0; i < SIGN_UP_LIMITS.address.points; i++) {
      const res = await behindProxy(peer).post('/api/auth/sign-up', { name: 'Limit', email: unique(), password: 'a long enough password' });
      expect(res.status).toBe(202);
    }
    const res = await behindProxy(peer).post('/api/auth/sign-up', { name: 'Limit', email: unique(), password: 'a long enough password' });
    expect(res.status).toBe(429);
    expect(Number(res.headers.get('retry-after'))).toBeGreaterThan(0);
    expect((await res.json()).error.message).toMatch(/Too many sign-ups from here\. Please wait \d+ minutes?/);
  });

  it(`allows ${SIGN_UP_LIMITS.account.points} sign-up attempts an hour for one e-mail address, from any address`, async () => {
    const email = unique();
    for (let i = 0; i < SIGN_UP_LIMITS.account.points; i++) {
      const res = await behindProxy(testNet3()).post('/api/auth/sign-up', { name: 'Same', email, password: 'a long enough password' });
      expect(res.status).not.toBe(429);
    }
    const res = await behindProxy(testNet3()).post('/api/auth/sign-up', { name: 'Same', email, password: 'a long enough password' });
    expect(res.status).toBe(429);
  });

  it(`allows ${RESET_LIMITS.address.points} reset requests per 15 minutes from one address`, async () => {
    const peer = testNet3();
    for (let i = 0; i < RESET_LIMITS.address.points; i++) {
      expect((await behindProxy(peer).post('/api/auth/forgot-password', { email: unique() })).status).toBe(202);
    }
    const res = await behindProxy(peer).post('/api/auth/forgot-password', { email: unique() });
    expect(res.status).toBe(429);
    expect((await res.json()).error.code).toBe('rate_limited');
  });

  it(`allows ${RESET_LIMITS.account.points} reset requests per 15 minutes for one e-mail address, known or not`, async () => {
    const email = unique();
    for (let i = 0; i < RESET_LIMITS.account.points; i++) {
      expect((await behindProxy(testNet3()).post('/api/auth/forgot-password', { email })).status).toBe(202);
    }
    expect((await behindProxy(testNet3()).post('/api/auth/forgot-password', { email })).status).toBe(429);
  });
});
