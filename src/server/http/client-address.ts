import type { IncomingMessage } from 'node:http';
import proxyaddr from 'proxy-addr';

/**
 * The client's address for one raw Node request: the socket's peer, or, when that peer is one of
 * our trusted proxies, the right-most X-Forwarded-For hop that is not a trusted proxy (RFC 7239
 * §7.4: everything left of our own proxies' hops is whatever the client typed). proxy-addr is the
 * walk Express uses for `trust proxy`.
 */
export function clientAddressOf(req: IncomingMessage, trusted: (addr: string, i: number) => boolean): string {
  const address = proxyaddr(req, trusted);
  // An IPv4 peer on a dual-stack socket reads ::ffff:1.2.3.4; count it as 1.2.3.4.
  return address.startsWith('::ffff:') && address.includes('.') ? address.slice(7) : address;
}

/** Compiles a TRUSTED_PROXIES list once; an empty list trusts nobody. */
export const trustProxies = (list: string[]) => proxyaddr.compile(list);

/** Set by src/serve.ts once it has replaced X-Forwarded-For with the address above. */
const ENTRY_MARK = Symbol.for('roundmark.client-address-resolved');

export function markAddressesResolved(): void {
  (globalThis as Record<symbol, unknown>)[ENTRY_MARK] = true;
}

/**
 * The caller's address for rate limits. Astro's node adapter takes the first X-Forwarded-For value
 * as `clientAddress`; src/serve.ts overwrites that header with the trusted address before Astro
 * sees the request. Served any other way (the adapter's own entry), the header is the client's
 * own word, so limits keyed on it would be worthless: refuse instead of guessing. `astro dev` is
 * allowed for local work.
 */
export function requestAddress(ctx: { clientAddress: string }, devServer = import.meta.env?.DEV === true): string {
  if (!(globalThis as Record<symbol, unknown>)[ENTRY_MARK] && !devServer) {
    throw new Error('Serve Roundmark with src/serve.ts (npm run serve): it resolves client addresses behind TRUSTED_PROXIES.');
  }
  return ctx.clientAddress;
}
