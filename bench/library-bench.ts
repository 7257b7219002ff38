/**
 * Library speed with 10,000 classes:
 * - throughput of the filtered library page (50 connections, closed loop) as a ratio to the
 *   cheapest signed-in request (session check and a redirect) in the same run: target >= 0.6;
 * - open-loop latency: p50/p99 of the library page at 50 and 100 requests/s, arrivals evenly
 *   spaced (bench/open-loop.ts): target p99 < 50 ms at 100 requests/s;
 * - page weights before/after compression (HTML, scripts, stylesheets as sent on the wire) and
 *   the scripts each page needs: library < 60 KB, member class page < 200 KB (with the HLS
 *   player), staff class page < 250 KB (with the editor).
 * Closed-loop latency with 50 busy connections is printed as context only: it is connections ÷
 * throughput (Little's law), not a latency target.
 */
import autocannon from 'autocannon';
import { sql } from 'drizzle-orm';
import { createAppDeps } from '~/server/app';
import { hashPassword } from '~/server/auth/passwords';
import { generateStudioWithClasses } from '../tests/helpers/many-classes';
import { benchSignIn, freshBenchDatabase, startBenchApp } from './bench-app';
import { openLoop } from './open-loop';
import { kb, pageWeight } from './page-weight';

const PORT = Number(process.env.ROUNDMARK_BENCH_PORT ?? 4391);

// A throwaway database: migrated, 10,000 published classes, one member.
const benchUrl = await freshBenchDatabase('roundmark_bench');
const deps = createAppDeps(benchUrl);
const STUDIO_SLUG = 'fernhill';
const { studioId } = await generateStudioWithClasses(deps, 10_000, STUDIO_SLUG);
await deps.db.execute(sql`insert into users (id, email, name, password_hash) values ('bench-member', 'bench@fernhill.example', 'Bench Member', ${await hashPassword('bench password 1')})`);
await deps.db.execute(sql`insert into memberships (user_id, studio_id, role) values ('bench-member', ${studioId}::uuid, 'member')`);
await deps.db.execute(sql`insert into users (id, email, name, password_hash) values ('bench-coach', 'bench-coach@fernhill.example', 'Bench Coach', ${await hashPassword('bench password 1')})`);
await deps.db.execute(sql`insert into memberships (user_id, studio_id, role) values ('bench-coach', ${studioId}::uuid, 'coach')`);
// An active membership, so the class page renders the player (and its scripts) for the size figure.
await deps.db.execute(sql`insert into subscriptions (studio_id, user_id, status, current_period_end) values (${studioId}::uuid, 'bench-member', 'active', now() + interval '30 days')`);

const { base, stop } = await startBenchApp(PORT, benchUrl);
try {
  const cookie = await benchSignIn(base, 'bench@fernhill.example', 'bench password 1');
  const load = (path: string, headers: Record<string, string> = {}) =>
    autocannon({ url: base + path, connections: 50, duration: 10, headers });
  // The library lives under its studio's address; /library only redirects there.
  const libraryPath = `/s/${STUDIO_SLUG}/library?impact=low&length=under-15&sort=newest`;
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

  // Page weights: each page with what it loads up front, without and with the server's compression.
  // Scripts as Chromium fetches them on opening the page (bench/page-weight.ts, ScriptSet): the
  // class pages' HLS player (loaded by the page's code once it shows a recording) counts; chunks
  // loaded only on demand do not. The earlier measure (every dynamic import counted) is printed
  // beside it as an upper bound.
  const coachCookie = await benchSignIn(base, 'bench-coach@fernhill.example', 'bench password 1');
  const someClass = (await deps.db.execute<{ id: string; slug: string }>(sql`select id, slug from lessons where studio_id = ${studioId}::uuid limit 1`)).rows[0]!;
  console.log('page weights (HTML + scripts + stylesheets; before = no compression, after = as the server sends them):');
  const pages = [
    { name: 'library page (member)', path: libraryPath, cookie, scriptTarget: 60 },
    { name: 'class page (member, with the HLS player)', path: `/s/${STUDIO_SLUG}/classes/${someClass.slug}`, cookie, scriptTarget: 200 },
    { name: 'class page (staff, with the editor and a ready recording)', path: `/studio/classes/${someClass.id}`, cookie: coachCookie, scriptTarget: 250 },
  ];
  for (const p of pages) {
    const w = await pageWeight(base, p.path, p.cookie, 'browser');
    const upper = await pageWeight(base, p.path, p.cookie, 'all-dynamic');
    console.log(
      `  ${p.name}: ${w.files} files, before ${kb(w.identityBytes)}, after ${kb(w.compressedBytes)} (${w.encoding}, ${(w.identityBytes / Math.max(1, w.compressedBytes)).toFixed(1)}× smaller); ` +
        `scripts on the wire ${kb(w.scriptCompressedBytes)} (target < ${p.scriptTarget} KB; every dynamic import counted: ${kb(upper.scriptCompressedBytes)})`,
    );
  }
} finally {
  stop();
  await deps.pool.end();
}
