import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, openSync, readFileSync, writeFileSync } from 'node:fs';

/**
 * How to start the built web server (src/serve.ts compiled by the build into `<dist>/serve.mjs`):
 * plain JavaScript, as `npm start` runs it in production. Tests, benchmarks and second servers all
 * start it this way.
 */
export const serveCommand = (dist = process.env.ROUNDMARK_DIST ?? 'dist'): [string, string[]] => ['node', [`${dist}/serve.mjs`]];

/**
 * Vitest global set-up: serves the built app (dist/) on ROUNDMARK_TEST_PORT against the test
 * database that docker-free-dev/run-tests.sh prepared, and runs the job worker beside it, for
 * the integration and browser tests. Both logs go to test-results/.
 */
export default async function setup() {
  const port = process.env.ROUNDMARK_TEST_PORT ?? '4399';
  const base = `http://127.0.0.1:${port}`;
  process.env.TEST_BASE_URL = base;
  const dist = process.env.ROUNDMARK_DIST ?? 'dist';
  if (!existsSync(`${dist}/serve.mjs`) || !process.env.DATABASE_URL) return;
  if (await healthy(base)) return; // already served by someone else (a second vitest run)
  mkdirSync('test-results', { recursive: true });
  const children: ChildProcess[] = [
    // The production entry; the tests play the reverse proxy on loopback, so each test client can
    // send its own X-Forwarded-For address (see api-client.ts) and rate limits keep apart.
    spawn(...serveCommand(dist), {
      env: { ...process.env, HOST: '127.0.0.1', PORT: port, ROUNDMARK_DIST: dist, TRUSTED_PROXIES: process.env.TRUSTED_PROXIES ?? 'loopback' },
      stdio: ['ignore', openSync('test-results/app.log', 'a'), openSync('test-results/app.log', 'a')],
    }),
    startWorker(),
  ];
  for (let i = 0; i < 150 && !(await healthy(base)); i++) await new Promise((r) => setTimeout(r, 100));
  if (!(await healthy(base))) throw new Error(`the app did not answer on ${base} (see test-results/app.log)`);
  return () => {
    for (const c of children) c.kill('SIGTERM');
    stopWorkerFromPidFile();
  };
}

/** Where the running worker's pid is kept, so a fault test can kill it and start another. */
export const WORKER_PID_FILE = `test-results/worker-${process.env.ROUNDMARK_TEST_PORT ?? '4399'}.pid`;

/**
 * Starts the job worker; a short stale limit lets recovery tests finish in seconds. `env` adds
 * settings; `prefix` runs it through another program first (a test's size-limited scratch disk).
 */
export function startWorker(options: { env?: Record<string, string>; prefix?: string[] } = {}): ChildProcess {
  mkdirSync('test-results', { recursive: true });
  const log = openSync('test-results/worker.log', 'a');
  const [program, ...args] = [...(options.prefix ?? []), 'node', '--import', 'tsx', 'src/worker.ts'];
  const child = spawn(program!, args, {
    env: { ...process.env, ROUNDMARK_STALE_SECONDS: '8', ...options.env },
    stdio: ['ignore', log, log],
  });
  writeFileSync(WORKER_PID_FILE, String(child.pid));
  return child;
}

function stopWorkerFromPidFile(): void {
  try {
    process.kill(Number(readFileSync(WORKER_PID_FILE, 'utf8')), 'SIGTERM');
  } catch {
    // already stopped
  }
}

async function healthy(base: string): Promise<boolean> {
  try {
    const res = await fetch(`${base}/api/health`, { signal: AbortSignal.timeout(1000) });
    return res.ok;
  } catch {
    return false;
  }
}
