/**
 * Two web processes and two job workers against one database, as a scaled-out deployment runs:
 * a publish through one web process shows at once in the other's shared library pages (LISTEN/
 * NOTIFY), each job is done exactly once, and a worker killed mid-job is recovered by the other.
 * Classes and recordings are generated for the test (invented, see published-class.ts).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtemp, readdir, readFile, rm } from 'node:fs/promises';
import { openSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pg from 'pg';
import { DEMO, DEMO_PASSWORD, signedIn, type ApiClient } from '../helpers/api-client';
import { createSmallClass } from '../helpers/published-class';
import { makeClip } from '../helpers/media-files';
import { uploadWhole, waitForRecording } from '../helpers/upload-flow';
import { serveCommand, startWorker, WORKER_PID_FILE } from '../helpers/app-server';

const otherPort = Number(process.env.ROUNDMARK_TEST_PORT ?? 4399) + 1;
const other = `http://127.0.0.1:${otherPort}`;
let otherApp: ChildProcess;
let secondWorker: ChildProcess;
let dir: string;
let coach: ApiClient;
let db: pg.Client;

const workerCommand: [string, string[]] = ['node', ['--import', 'tsx', 'src/worker.ts']];

function spawnLogged([command, args]: [string, string[]], env: Record<string, string>, log: string): ChildProcess {
  const out = openSync(`test-results/${log}`, 'a');
  return spawn(command, args, { env: { ...process.env, ...env }, stdio: ['ignore', out, out] });
}

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'roundmark-two-'));
  otherApp = spawnLogged(serveCommand(), { HOST: '127.0.0.1', PORT: String(otherPort) }, 'app-2.log');
  secondWorker = spawnLogged(workerCommand, { ROUNDMARK_STALE_SECONDS: '8' }, 'worker-2.log');
  for (let i = 0; i < 300; i++) {
    if (await fetch(`${other}/api/health`).then((r) => r.ok).catch(() => false)) break;
    await new Promise((r) => setTimeout(r, 100));
  }
  coach = await signedIn(DEMO.coach);
  db = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await db.connect();
}, 120_000);

afterAll(async () => {
  otherApp?.kill('SIGTERM');
  secondWorker?.kill('SIGTERM');
  await db?.end();
  await rm(dir, { recursive: true, force: true });
});

/** Signs a member in on the other web process (sessions live in the shared database). */
async function memberOnOther(): Promise<string> {
  const res = await fetch(`${other}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: other },
    body: JSON.stringify({ email: DEMO.member, password: DEMO_PASSWORD }),
  });
  expect(res.status).toBe(200);
  return res.headers.getSetCookie()[0]!.split(';')[0]!;
}

describe('two web processes and two workers on one database', () => {
  it('shows a class published through one process in the other’s library at once, with each job done once', async () => {
    const cookie = await memberOnOther();
    const library = async () => (await fetch(`${other}/library?sort=newest`, { headers: { cookie } })).text();
    const title = `Across processes ${Date.now()}`;
    expect(await library()).not.toContain(title); // the other process now holds this page in its shared cache

    const cls = await createSmallClass(coach, dir, title);
    const pub = await coach.post(`/api/lessons/${cls.lessonId}/publish`, { acknowledgeWarnings: true });
    expect(pub.status).toBe(201);
    // The notification reaches the other process asynchronously: wait for the state, not a time.
    await expect.poll(library, { timeout: 15_000, interval: 200 }).toContain(title);

    // Two workers polled the same queues: each step that made this recording ready ran exactly once.
    // (Work queued after it is ready, such as hearing its sounds, may still be waiting.)
    const jobs = await db.query<{ name: string; state: string; n: number }>(
      `select name, state, count(*)::int as n from pgboss.job
        where data->>'recordingId' = $1 and name in ('recording.probe', 'recording.package') group by name, state order by name`,
      [cls.recordingId],
    );
    expect(jobs.rows).toEqual([
      { name: 'recording.package', state: 'completed', n: 1 },
      { name: 'recording.probe', state: 'completed', n: 1 },
    ]);
  });

  it('recovers a recording in the other worker when the one packaging it is killed', async () => {
    const lesson = await (await coach.post('/api/lessons', { title: `Killed worker ${Date.now()}`, advertisedMinutes: 5, impact: 'low' })).json();
    await makeClip(join(dir, 'long.mp4'), { seconds: 60, size: '1280x720' });
    const { recordingId } = await uploadWhole(coach, lesson.id, 'long.mp4', new Uint8Array(await readFile(join(dir, 'long.mp4'))));
    await waitForRecording(coach, recordingId, 120_000, (r: { step: string | null; progress: number; state: string }) => (r.step === 'package' && r.progress > 5) || r.state !== 'processing');

    // The worker packaging it is the parent of the running ffmpeg.
    const firstPid = Number(await readFile(WORKER_PID_FILE, 'utf8'));
    const packaging = await ffmpegParents();
    const victim = [firstPid, secondWorker.pid!].find((pid) => packaging.has(pid));
    expect(victim).toBeDefined();
    process.kill(victim!, 'SIGKILL');
    for (const child of packaging.get(victim!) ?? []) process.kill(child, 'SIGKILL');

    const ready = await waitForRecording(coach, recordingId, 240_000);
    expect(ready.state).toBe('ready');
    // Keep a worker under the pid file for the tests that follow.
    if (victim === firstPid) startWorker();
    else secondWorker = spawnLogged(workerCommand, { ROUNDMARK_STALE_SECONDS: '8' }, 'worker-2.log');
  }, 420_000); // packaging a minute of 720p twice on a busy 2-core machine: states are awaited, this only bounds it
});

/** Running ffmpeg processes by parent pid (Linux /proc). */
async function ffmpegParents(): Promise<Map<number, number[]>> {
  const parents = new Map<number, number[]>();
  for (const entry of await readdir('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      const stat = await readFile(`/proc/${entry}/stat`, 'utf8');
      const name = stat.slice(stat.indexOf('(') + 1, stat.lastIndexOf(')'));
      if (name !== 'ffmpeg') continue;
      const ppid = Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[1]);
      parents.set(ppid, [...(parents.get(ppid) ?? []), Number(entry)]);
    } catch {
      // the process ended while we looked
    }
  }
  return parents;
}
