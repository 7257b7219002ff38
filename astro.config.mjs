// @ts-check
import { defineConfig } from 'astro/config';
import node from '@astrojs/node';
import react from '@astrojs/react';
import tailwindcss from '@tailwindcss/vite';

export default defineConfig({
  output: 'server',
  adapter: node({ mode: 'standalone' }),
  integrations: [react()],
  server: { host: '127.0.0.1', port: 4321 },
  // Astro's origin check stays on: form posts from other sites are refused.
  security: { checkOrigin: true },
  vite: {
    plugins: [tailwindcss()],
    // Native modules and server-only packages are loaded by Node, not bundled.
    ssr: { external: ['@node-rs/argon2', 'pg-boss', 'fluent-ffmpeg', 'pg', 'nodemailer', 'stripe'] },
    optimizeDeps: { exclude: ['@node-rs/argon2'] },
  },
});
