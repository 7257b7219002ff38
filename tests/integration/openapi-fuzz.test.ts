/**
 * Fuzzes every operation of the OpenAPI document the app serves with random and hostile route
 * ids, query strings and bodies, as five kinds of caller (signed out, member, editor, coach,
 * owner of a studio made for this test), and holds each answer to three rules:
 *   1. never a 5xx;
 *   2. the answer is one the document describes (status and body: the ApiClient's contract
 *      check), and every error body has the shared shape `{ error: { code, message, fields? } }`;
 *   3. a refused write leaves the database as it was (an md5 per table of its ordered rows,
 *      taken before and after; sessions and the sign-in rate limiter's counters excepted).
 * Requests are generated with fast-check from a seed: fixed under CI=true, random locally,
 * FC_SEED=<seed> replays a run; FUZZ_REQUESTS sets how many (default 2,400). The job worker is
 * stopped while the requests run, so the only writes to the database are the requests' own.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { createAppDeps } from '~/server/app';
import { errorOutput } from '~/lib/api/error-schemas';
import { ApiClient, BASE } from '../helpers/api-client';
import { startWorker } from '../helpers/app-server';
import { processAlive, waitUntil, workerPid } from '../helpers/local-services';
import { changedTables, tableChecksums } from '../helpers/db-checksum';
import { anyRequest, operationsOf, type FuzzRequest, type OpenApiDocument } from '../helpers/fuzz-requests';
import { createFuzzStudio, FUZZ_ROLES, seedFuzzStudio, signInAs, type FuzzRole, type FuzzStudio } from '../helpers/fuzz-studio';

const deps = createAppDeps(process.env.DATABASE_URL!);
const SEED = process.env.FC_SEED ? Number(process.env.FC_SEED) : process.env.CI ? 20261202 : Math.floor(Math.random() * 2 ** 31);
const REQUESTS = Number(process.env.FUZZ_REQUESTS ?? 2400);
/** An answer slower than this counts as a hang (the bound for any request). */
const ANSWER_DEADLINE_MS = 10_000;

let studio: FuzzStudio;
let doc: OpenApiDocument;
const clients = {} as Record<FuzzRole, ApiClient>;
let workerStopped = false;

async function stopWorker() {
  const pid = workerPid();
  if (!processAlive(pid)) return;
  process.kill(pid, 'SIGTERM');
  workerStopped = true;
  await waitUntil('the worker to stop', () => !processAlive(pid), 60_000);
}

beforeAll(async () => {
  studio = await createFuzzStudio(deps);
  for (const role of FUZZ_ROLES) clients[role] = await signInAs(studio, role);
  clients.anonymous = new ApiClient();
  await seedFuzzStudio(studio, clients.owner, clients.coach);
  doc = (await (await fetch(`${BASE()}/api/openapi.json`)).json()) as OpenApiDocument;
  await stopWorker();
}, 300_000);

afterAll(async () => {
  if (workerStopped) startWorker();
  await deps.pool.end();
});

/** The ids a route parameter may point at: the kind its path names, plus another studio's class. */
function idsFor(template: string): string[] {
  const { lesson, recording, promo, invitation, otherStudio } = studio.ids;
  if (template.startsWith('/api/lessons/')) return [...lesson, ...otherStudio];
  if (template.startsWith('/api/recordings/')) return [...recording, ...lesson];
  if (template.includes('promo-codes')) return [...promo, ...lesson];
  if (template.includes('invitations')) return [...invitation, ...promo];
  return [...lesson, ...recording, ...promo, ...invitation, ...otherStudio];
}

interface Problem {
  kind: '5xx' | 'undocumented answer' | 'error shape' | 'refused write changed the database' | 'no answer';
  request: FuzzRequest;
  role: FuzzRole;
  status?: number;
  detail: string;
}

function withDeadline<T>(p: Promise<T>, ms: number): Promise<T> {
  return Promise.race([p, new Promise<T>((_, reject) => setTimeout(() => reject(new Error(`no answer within ${ms} ms`)), ms).unref())]);
}

describe('every documented operation under random and hostile input', () => {
  it(`answers ${REQUESTS} requests without a 5xx, an undocumented answer or a half-applied refused write`, async () => {
    const roles: FuzzRole[] = ['anonymous', ...FUZZ_ROLES];
    const plan = fc.sample(fc.tuple(fc.constantFrom(...roles), anyRequest(doc, (template) => idsFor(template))), { seed: SEED, numRuns: REQUESTS });
    const problems: Problem[] = [];
    const byStatus = new Map<number, number>();
    const byOperation = new Map<string, number>();
    let sent = 0;
    const started = Date.now();

    for (const [role, request] of plan) {
      const client = clients[role];
      if (role === 'anonymous') client.cookie = '';
      else if (!client.cookie) await signInAs(studio, role, client); // a fuzzed sign-out or password reset ended the session
      let contractError = '';
      client.onContractError = (e) => {
        contractError = e instanceof Error ? e.message : String(e);
      };
      const write = request.method !== 'GET';
      const before = write ? await tableChecksums(deps.pool) : null;
      const problem = (kind: Problem['kind'], detail: string, status?: number) => problems.push({ kind, request, role, status, detail });
      let res: Response;
      try {
        sent++;
        res = await withDeadline(
          client.request(request.method, request.path, request.body, request.contentType ? { 'content-type': request.contentType } : {}),
          ANSWER_DEADLINE_MS,
        );
      } catch (e) {
        problem('no answer', e instanceof Error ? e.message : String(e));
        continue;
      }
      byStatus.set(res.status, (byStatus.get(res.status) ?? 0) + 1);
      const key = `${request.method} ${request.template}`;
      byOperation.set(key, (byOperation.get(key) ?? 0) + 1);
      const text = await res.text();
      if (res.status >= 500) problem('5xx', text.slice(0, 300), res.status);
      if (contractError) problem('undocumented answer', contractError.slice(0, 400), res.status);
      if (res.status >= 400) {
        let body: unknown = undefined;
        try {
          body = JSON.parse(text);
        } catch {
          // not JSON: reported below
        }
        if (!errorOutput.safeParse(body).success) problem('error shape', `${res.headers.get('content-type')}: ${text.slice(0, 200)}`, res.status);
        if (before) {
          const changed = changedTables(before, await tableChecksums(deps.pool));
          if (changed.length) problem('refused write changed the database', `changed: ${changed.join(', ')}`, res.status);
        }
      }
    }

    const seconds = ((Date.now() - started) / 1000).toFixed(1);
    const statuses = [...byStatus].sort(([a], [b]) => a - b).map(([s, n]) => `${s}: ${n}`).join(', ');
    console.log(`API fuzz (seed ${SEED}): ${sent} requests over ${operationsOf(doc).length} operations in ${seconds} s; by status ${statuses}; problems ${problems.length}`);
    const missed = operationsOf(doc).filter((op) => !byOperation.has(`${op.method} ${op.template}`));
    // One line per kind of problem and operation, with the first example, so a run lists every distinct finding.
    const distinct = new Map<string, Problem & { times: number }>();
    for (const p of problems) {
      const k = `${p.kind} | ${p.request.method} ${p.request.template} | ${p.status ?? '-'}`;
      const seen = distinct.get(k);
      if (seen) seen.times++;
      else distinct.set(k, { ...p, times: 1 });
    }
    const report = [...distinct].map(([k, p]) => `${k} ×${p.times} as ${p.role}: ${p.request.path} ${p.request.contentType ?? ''} ${(p.request.body ?? '').slice(0, 160)}\n    ${p.detail}`);
    if (report.length) console.log(report.join('\n'));
    expect(missed.map((op) => `${op.method} ${op.template}`), 'operations the run never reached').toEqual([]);
    expect(sent).toBeGreaterThanOrEqual(REQUESTS);
    expect(report, `replay with FC_SEED=${SEED}`).toEqual([]);
  }, 600_000);
});
