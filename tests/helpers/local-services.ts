/**
 * Stops and restarts this checkout's own local services (docker-free-dev/services.sh, on the
 * ports the environment gives this checkout), for the fault tests. Tests that stop a service
 * bring everything back with `startServices()` in `finally`/afterAll.
 */
import { execFile } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { promisify } from 'node:util';
import { startWorker, WORKER_PID_FILE } from './app-server';

const run = promisify(execFile);

export type ServiceName = 'postgresql' | 'object-store' | 'mail' | 'payments';

export async function stopService(name: ServiceName): Promise<void> {
  await run('bash', ['docker-free-dev/services.sh', 'stop', name], { timeout: 120_000 });
}

/** Starts whatever is not running; a no-op for the ones that are. */
export async function startServices(): Promise<void> {
  await run('bash', ['docker-free-dev/services.sh', 'up'], { timeout: 180_000 });
}

/** Polls until `done` holds; fails with `what` after the deadline. Never a fixed sleep. */
export async function waitUntil(what: string, done: () => boolean | Promise<boolean>, deadlineMs: number, everyMs = 100): Promise<void> {
  const end = Date.now() + deadlineMs;
  while (!(await done())) {
    if (Date.now() > end) throw new Error(`gave up after ${deadlineMs} ms waiting for ${what}`);
    await new Promise((r) => setTimeout(r, everyMs));
  }
}

export function processAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

/** The job worker the test app runs (its pid file is rewritten when a test starts another). */
export const workerPid = () => Number(readFileSync(WORKER_PID_FILE, 'utf8'));

/** Starts a worker again if the one the test app ran is gone; says whether it had to. */
export function ensureWorker(): boolean {
  if (processAlive(workerPid())) return false;
  startWorker();
  return true;
}
