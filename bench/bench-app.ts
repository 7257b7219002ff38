import { spawn } from 'node:child_process';
import pg from 'pg';
import { serveCommand } from '../tests/helpers/app-server';

/**
 * A throwaway database for one benchmark: dropped if left over, created, migrated. Its URL is
 * the app database's with another name, so it lives in the same local PostgreSQL.
 */
export async function freshBenchDatabase(name: string): Promise<string> {
  const admin = process.env.DATABASE_URL!;
  const root = new pg.Client({ connectionString: admin });
  await root.connect();
  await root.query(`drop database if exists ${name} with (force)`);
  await root.query(`create database ${name} owner roundmark`);
  await root.end();
  const url = admin.replace(/\/[^/]+$/, `/${name}`);
  await run('npx', ['tsx', 'src/scripts/migrate.ts'], { DATABASE_URL: url });
  return url;
}

/** Starts the built app (one process unless told otherwise) on `port` against `databaseUrl`; waits until it answers. */
export async function startBenchApp(port: number, databaseUrl: string, env: Record<string, string> = {}) {
  const base = `http://127.0.0.1:${port}`;
  if (await fetch(`${base}/api/health`).then(() => true).catch(() => false)) {
    throw new Error(`port ${port} is taken: set ROUNDMARK_BENCH_PORT to a free port`);
  }
  const server = spawn(...serveCommand(), {
    env: { ...process.env, DATABASE_URL: databaseUrl, HOST: '127.0.0.1', PORT: String(port), ...env },
    stdio: 'ignore',
  });
  for (let i = 0; i < 300; i++) {
    if (await fetch(`${base}/api/health`).then((r) => r.ok).catch(() => false)) break;
    await new Promise((r) => setTimeout(r, 100));
  }
  return { base, stop: () => void server.kill('SIGTERM') };
}

/** Signs in through the JSON door and returns the session cookie (`name=value`). */
export async function benchSignIn(base: string, email: string, password: string): Promise<string> {
  const res = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: base },
    body: JSON.stringify({ email, password }),
  });
  if (!res.ok) throw new Error(`bench sign-in failed: ${res.status} ${await res.text()}`);
  return res.headers.getSetCookie()[0]!.split(';')[0]!;
}

export function run(cmd: string, args: string[], env: Record<string, string> = {}): Promise<void> {
  return new Promise((resolve, reject) => {
    const p = spawn(cmd, args, { env: { ...process.env, ...env }, stdio: 'ignore' });
    p.on('exit', (code) => (code === 0 ? resolve() : reject(new Error(`${cmd} ${args.join(' ')} exited ${code}`))));
  });
}
