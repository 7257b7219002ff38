import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';

/**
 * Vitest global set-up: serves the built app (dist/) on ROUNDMARK_TEST_PORT against the test
 * database that docker-free-dev/run-tests.sh prepared, for the integration and browser tests.
 */
export default async function setup() {
  const port = process.env.ROUNDMARK_TEST_PORT ?? '4399';
  const base = `http://127.0.0.1:${port}`;
  process.env.TEST_BASE_URL = base;
  if (!existsSync('dist/server/entry.mjs') || !process.env.DATABASE_URL) return;
  if (await healthy(base)) return; // already served by someone else (a second vitest run)
  const child: ChildProcess = spawn('node', ['dist/server/entry.mjs'], {
    env: { ...process.env, HOST: '127.0.0.1', PORT: port },
    stdio: ['ignore', 'inherit', 'inherit'],
  });
  for (let i = 0; i < 100 && !(await healthy(base)); i++) await new Promise((r) => setTimeout(r, 100));
  if (!(await healthy(base))) throw new Error(`the app did not answer on ${base}`);
  return () => {
    child.kill('SIGTERM');
  };
}

async function healthy(base: string): Promise<boolean> {
  try {
    const res = await fetch(`${base}/api/health`, { signal: AbortSignal.timeout(1000) });
    return res.ok;
  } catch {
    return false;
  }
}
