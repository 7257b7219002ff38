import { defineConfig } from 'vitest/config';
import { fileURLToPath } from 'node:url';

// Kept under tests/ so the project's top level stays as the layout in DEVELOPERS.md; paths are from the root.
const root = fileURLToPath(new URL('..', import.meta.url));
const alias = { '~': fileURLToPath(new URL('../src', import.meta.url)) };

// Three projects: unit tests need nothing running; integration and e2e tests need the
// services that docker-free-dev/run-tests.sh starts (PostgreSQL, object store, mail fake).
export default defineConfig({
  root,
  resolve: { alias },
  test: {
    // Serves the built app for the integration and browser projects (see the file for why).
    globalSetup: ['tests/helpers/app-server.ts'],
    projects: [
      {
        resolve: { alias },
        // Property tests run hundreds of cases: on a busy 2-core machine 5 s is not enough.
        test: { name: 'unit', include: ['tests/unit/**/*.test.ts'], environment: 'node', setupFiles: ['tests/unit/fast-check-setup.ts'], sequence: { groupOrder: 0 }, testTimeout: 60_000 },
      },
      {
        resolve: { alias },
        test: {
          name: 'integration',
          // Integration, then browser tests, never at the same time: they share the app, its worker and the database.
          sequence: { groupOrder: 1 },
          include: ['tests/integration/**/*.test.ts'],
          environment: 'node',
          testTimeout: 120_000,
          hookTimeout: 180_000,
          poolOptions: { forks: { singleFork: true } },
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'e2e',
          sequence: { groupOrder: 2 },
          include: ['tests/e2e/**/*.test.ts'],
          // Fails a browser test on an undocumented API answer or a CSP violation (see the file).
          setupFiles: ['tests/e2e/browser-checks-setup.ts'],
          environment: 'node',
          testTimeout: 180_000,
          // Long enough for ensureDeskBreakPublished (demo recording made on the machine, up to 5 min).
          hookTimeout: 360_000,
          poolOptions: { forks: { singleFork: true } },
        },
      },
    ],
  },
});
