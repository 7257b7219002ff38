// @ts-check
import { defineConfig } from 'astro/config';
import node from '@astrojs/node';
import react from '@astrojs/react';
import tailwindcss from '@tailwindcss/vite';
import { settings } from './src/server/env.ts';
import { productionServer } from './src/build/production-server.ts';

// Hosts whose Host header Astro trusts when building request URLs (the origin check compares
// against them). Loopback for local use, plus the public host the build is made for.
const { PUBLIC_BASE_URL } = settings();
const publicHost = PUBLIC_BASE_URL ? new URL(PUBLIC_BASE_URL).hostname : undefined;
const allowedDomains = [{ hostname: '127.0.0.1' }, { hostname: 'localhost' }];
if (publicHost && !allowedDomains.some((d) => d.hostname === publicHost)) allowedDomains.push({ hostname: publicHost });

export default defineConfig({
  output: 'server',
  // Middleware mode: the adapter only renders; src/serve.ts serves the client files itself (from a
  // list read once at start, precompressed), so a page request costs no file-system look-up.
  // Pages are sent whole, not streamed: every page loads its data before its first byte anyway, and
  // one write per page (instead of one per rendered chunk) is markedly cheaper for the server.
  adapter: node({ mode: 'middleware', experimentalDisableStreaming: true }),
  integrations: [react(), productionServer()],
  server: { host: '127.0.0.1', port: 4321 },
  // Astro's origin check stays on: form posts from other sites are refused.
  security: { checkOrigin: true, allowedDomains },
  // Astro hashes the inline scripts it writes (island bootstrap, hydration directives) into a
  // Content-Security-Policy header; src/server/http/security-headers.ts takes those hashes into
  // the app's full policy, so no 'unsafe-inline' is needed for scripts.
  experimental: { csp: { algorithm: 'SHA-256' } },
  vite: {
    plugins: [tailwindcss()],
    // Native modules and server-only packages are loaded by Node, not bundled.
    ssr: { external: ['@node-rs/argon2', 'pg-boss', 'pg', 'nodemailer', 'stripe'] },
    optimizeDeps: { exclude: ['@node-rs/argon2'] },
  },
});
