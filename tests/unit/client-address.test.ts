import type { IncomingMessage } from 'node:http';
import { describe, expect, it } from 'vitest';
import { clientAddressOf, trustProxies } from '~/server/http/client-address';

// Invented addresses from the documentation ranges of RFC 5737 (192.0.2.0/24, 198.51.100.0/24, 203.0.113.0/24).
const req = (peer: string, xff?: string) =>
  ({ socket: { remoteAddress: peer }, connection: { remoteAddress: peer }, headers: xff ? { 'x-forwarded-for': xff } : {} }) as unknown as IncomingMessage;

describe('clientAddressOf', () => {
  it.each([
    // [trusted proxies, socket peer, X-Forwarded-For, expected]
    [[], '203.0.113.9', '192.0.2.1', '203.0.113.9'], // nobody trusted: the header is ignored
    [['loopback'], '127.0.0.1', undefined, '127.0.0.1'], // no header: the peer itself
    [['loopback'], '127.0.0.1', '192.0.2.1, 203.0.113.9', '203.0.113.9'], // right-most untrusted hop (RFC 7239 §7.4; common practice)
    [['loopback', '198.51.100.0/24'], '127.0.0.1', '192.0.2.1, 203.0.113.9, 198.51.100.4', '203.0.113.9'], // two proxies in a row
    [['198.51.100.0/24'], '203.0.113.9', '192.0.2.1', '203.0.113.9'], // a peer that is not our proxy cannot forward
    [[], '::ffff:203.0.113.9', undefined, '203.0.113.9'], // IPv4 on a dual-stack socket
  ] as const)('trusting %j, peer %s, X-Forwarded-For %s -> %s', (trusted, peer, xff, expected) => {
    expect(clientAddressOf(req(peer, xff), trustProxies([...trusted]))).toBe(expected);
  });
});
