/**
 * Library speed with 10,000 classes:
 * - throughput of the filtered library page (50 connections, closed loop) as a ratio to the
 *   cheapest signed-in request (session check and a redirect) in the same run: target >= 0.6;
 * - open-loop latency: p50/p99 of the library page at 50 and 100 requests/s, arrivals evenly
 *   spaced (bench/open-loop.ts): target p99 < 50 ms at 100 requests/s;
 * - the JavaScript shipped to the library and class pages (gzip bytes): library < 60 KB, class
 *   page < 200 KB (with the HLS player).
 * Closed-loop latency with 50 busy connections is printed as context only: it is connections ÷
 * throughput (Little's law), not a latency target.
 */
import { spawn } from 'node:child_process';
import { readFile } from 'node:fs/promises';
import { gzipSync } from 'node:zlib';
import autocannon from 'autocannon';
import pg from 'pg';
import { sql } from 'drizzle-orm';
import { createAppDeps } from '~/server/app';
import { hashPassword } from '~/server/auth/passwords';
import { generateStudioWithClasses } from '../tests/helpers/many-classes';
import { openLoop } from './open-loop';

const PORT = Number(process.env.ROUNDMARK_BENCH_PORT ?? 4391);
const base = `http://127.0.0.1:${PORT}`;
const admin = process.env.DATABASE_URL!;
const benchUrl = admin.replace(/\/[^/]+$/, '/roundmark_bench');

if (await fetch(`${base}/api/health`).then(() => true).catch(() => false)) {
  throw new Error(`port ${PORT} is taken: set ROUNDMARK_BENCH_PORT to a free port`);
}

// A throwaway database: migrated, 10,000 published classes, one member.
const root = new pg.Client({ connectionString: admin });
await root.connect();
await root.query('drop database if exists roundmark_bench with (force)');
await root.query('create database roundmark_bench owner roundmark');
await root.end();
await run('npx', ['tsx', 'src/scripts/migrate.ts'], { DATABASE_URL: benchUrl });
const deps = createAppDeps(benchUrl);
const { studioId } = await generateStudioWithClasses(deps, 10_000, 'fernhill');
await deps.db.execute(sql`insert into users (id, email, name, password_hash) values ('bench-member', 'bench@fernhill.example', 'Bench Member', ${await hashPassword('bench password 1')})`);
await deps.db.execute(sql`insert into memberships (user_id, studio_id, role) values ('bench-member', ${studioId}::uuid, 'member')`);
// An active membership, so the class page renders the player (and its scripts) for the size figure.
await deps.db.execute(sql`insert into subscriptions (studio_id, user_id, status, current_period_end) values (${studioId}::uuid, 'bench-member', 'active', now() + interval '30 days')`);
await deps.pool.end();

const server = spawn('node', ['--import', 'tsx', 'src/serve.ts'], { env: { ...process.env, DATABASE_URL: benchUrl, HOST: '127.0.0.1', PORT: String(PORT) }, stdio: 'ignore' });
try {
  for (let i = 0; i < 100; i++) {
    if (await fetch(`${base}/api/health`).then((r) => r.ok).catch(() => false)) break;
    await new Promise((r) => setTimeout(r, 100));
  }
  const signIn = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: base },
    body: JSON.stringify({ email: 'bench@fernhill.example', password: 'bench password 1' }),
  });
  if (!signIn.ok) throw new Error(`bench sign-in failed: ${signIn.status} ${await signIn.text()}`);
  const cookie = signIn.headers.getSetCookie()[0]!.split(';')[0]!;
  const load = (path: string, headers: Record<string, string> = {}) =>
    autocannon({ url: base + path, connections: 50, duration: 10, headers });
  const libraryPath = '/library?impact=low&length=under-15&sort=newest';
  await load(libraryPath, { cookie }); // warm-up: JIT, connection pool, PostgreSQL caches
  const health = await load('/api/health');
  const library = await load(libraryPath, { cookie });
  // Every request a search nobody asked before, so no shared page helps: the query path itself.
  let n = 0;
  const unshared = await autocannon({
    url: base + libraryPath,
    connections: 50,
    duration: 10,
    headers: { cookie },
    requests: [{ setupRequest: (req) => ({ ...req, path: `${libraryPath}&q=class+${++n}` }) }],
  });
  // Context, not targets: what this machine's server does for a static file and for a page that
  // reads nothing from the database (the sign-in form).
  const staticFile = await load('/favicon.svg');
  const plainPage = await load('/sign-in');
  const sessionOnly = await load('/sign-in', { cookie }); // signed in: the session check, then a redirect
  const line = (name: string, r: autocannon.Result) =>
    `  ${name}: p50 ${r.latency.p50} ms, p99 ${r.latency.p99} ms, ${Math.round(r.requests.average)} req/s, ${r.non2xx} non-2xx`;
  console.log('library with 10,000 classes, closed loop: 50 connections, 10 s each (latency here is connections ÷ throughput: context only):');
  console.log(line('GET /api/health (baseline)', health));
  console.log(line(`GET ${libraryPath}`, library));
  console.log(line('the same with a new search each request (nothing shared)', unshared));
  console.log(line('context: GET /favicon.svg (static file)', staticFile));
  console.log(line('context: GET /sign-in signed out (a page without data)', plainPage));
  console.log(line('context: GET /sign-in signed in (session check and a redirect, no page)', sessionOnly));
  const ratio = library.requests.average / Math.max(1, sessionOnly.requests.average);
  console.log(`  throughput ratio library / signed-in redirect: ${ratio.toFixed(2)} (target >= 0.6)`);

  console.log('open-loop latency of the library page (evenly spaced arrivals, kept-alive connections opened as needed, 20 s each):');
  for (const rate of [50, 100]) {
    const r = await openLoop(base + libraryPath, { cookie }, rate, 20);
    console.log(`  ${rate} requests/s: p50 ${r.p50} ms, p99 ${r.p99} ms, max ${r.max} ms, ${r.failed} failed of ${r.sent}${rate === 100 ? ' (target p99 < 50 ms)' : ''}`);
  }

  console.log('JavaScript shipped (gzip):');
  console.log(`  library page: ${(await shippedJs(`${base}${libraryPath}`, cookie, false)) / 1000} KB (target < 60 KB)`);
  // A class page of the generated studio (its player loads hls.js on demand: counted too).
  console.log(`  class page: ${(await shippedJs(`${base}/library`, cookie, true, true)) / 1000} KB including the HLS player (target < 200 KB)`);
} finally {
  server.kill('SIGTERM');
}

/** Sums gzip sizes of the scripts a page loads, following static imports (and dynamic ones when asked). */
async function shippedJs(pageUrl: string, cookie: string, followDynamic: boolean, isClassPage = false): Promise<number> {
  let html = await (await fetch(pageUrl, { headers: { cookie } })).text();
  // The player's scripts are the same for any class, so a generated one stands in.
  if (isClassPage) html = await (await fetch(`${base}/classes/class-1`, { headers: { cookie } })).text();
  const start = [...html.matchAll(/(?:src|component-url|renderer-url)="(\/_astro\/[^"]+\.js)"/g)].map((m) => m[1]!);
  const seen = new Set<string>();
  let total = 0;
  const queue = [...start];
  while (queue.length) {
    const path = queue.shift()!;
    if (seen.has(path)) continue;
    seen.add(path);
    const text = await readFile(`dist/client${path}`, 'utf8');
    total += gzipSync(text).length;
    const dir = path.slice(0, path.lastIndexOf('/') + 1);
    const statics = [...text.matchAll(/(?:import|from)\s*["'](\.\/[^"']+\.js)["']/g)].map((m) => dir + m[1]!.slice(2));
    const dynamics = followDynamic ? [...text.matchAll(/import\(\s*["'](\.\/[^"']+\.js)["']\s*\)/g)].map((m) => dir + m[1]!.slice(2)) : [];
    queue.push(...statics, ...dynamics);
  }
  return total;
}

function run(cmd: string, args: string[], env: Record<string, string>): Promise<void> {
  return new Promise((resolve, reject) => {
    const p = spawn(cmd, args, { env: { ...process.env, ...env }, stdio: 'ignore' });
    p.on('exit', (code) => (code === 0 ? resolve() : reject(new Error(`${cmd} ${args.join(' ')} exited ${code}`))));
  });
}
