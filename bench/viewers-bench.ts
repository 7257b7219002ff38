/**
 * Viewers per app process (issue "Scale out", section 3): simulated members watching a
 * 30-minute class, added until p99 of the app's answers passes 200 ms, before and after media
 * bytes left the app.
 *
 * A simulated viewer fetches the master and the media playlist when it starts (viewers start
 * evenly over the class's 30 minutes, so N viewers start N/1800 times a second) and one 4 s
 * segment every 4 s. "Before": every segment through the app, as before presigned links (served
 * here through the app's byte-range path: access check, then the bytes streamed from the store).
 * "After": segments go to the object store or a CDN, not to the app, so the app sees only the
 * playlists (the segment requests are not sent: on this one machine they would only measure the
 * local store). Each mode runs twice: as the issue defines a viewer, and with the progress report
 * the real player also sends every 5 s. The requests of a step are one evenly spaced open-loop
 * stream (bench/open-loop.ts) at the step's total rate, 8–30 s per step (at least 200 answers);
 * N doubles from 25 (or from where the app gets 5 requests/s).
 *
 * The class: a generated 40 s 720p clip packaged by the app's own ffmpeg arguments, published in
 * a throwaway database, its media playlists stretched to 450 segments (30 minutes) so that each
 * playlist answer signs as many links as a real 30-minute class; only the 40 s of segments exist.
 */
import { execFile } from 'node:child_process';
import { mkdtemp, readdir, readFile, rm, writeFile } from 'node:fs/promises';
import { loadavg, tmpdir } from 'node:os';
import { join, relative } from 'node:path';
import { promisify } from 'node:util';
import { PutObjectCommand } from '@aws-sdk/client-s3';
import { sql } from 'drizzle-orm';
import { buildPackageArgs } from '~/lib/media/hls-ladder';
import { probeVerdict } from '~/lib/media/probe-verdict';
import { createAppDeps } from '~/server/app';
import { hashPassword } from '~/server/auth/passwords';
import { probeFile, runFfmpeg } from '~/server/media/ffmpeg-runner';
import { storage } from '~/server/storage';
import { generateStudioWithClasses } from '../tests/helpers/many-classes';
import { benchSignIn, freshBenchDatabase, startBenchApp } from './bench-app';
import { openLoopMix, type LoopRequest } from './open-loop';

const PORT = Number(process.env.ROUNDMARK_BENCH_PORT ?? 4391);
const CLASS_SECONDS = 1800;
const SEGMENT_SECONDS = 4;
const PROGRESS_SECONDS = 5;
const STEP_SECONDS = 8;
const MIN_SAMPLES = 200; // a p99 needs enough answers: a step runs longer (up to 30 s) at low rates
const START_RATE = 5; // the first step sends at least this many requests/s
const P99_LIMIT_MS = 200;
const MAX_VIEWERS = 102_400;
const MAX_RATE = 1500; // what one sender process on this machine spaces evenly; above it the sender, not the app, is measured

const run = promisify(execFile);
const benchUrl = await freshBenchDatabase('roundmark_viewers');
const deps = createAppDeps(benchUrl);
const { studioId } = await generateStudioWithClasses(deps, 1, `viewers-${Date.now()}`);
await deps.db.execute(sql`insert into users (id, email, name, password_hash) values ('viewer', 'viewer@fernhill.example', 'Bench Viewer', ${await hashPassword('viewer password 1')})`);
await deps.db.execute(sql`insert into memberships (user_id, studio_id, role) values ('viewer', ${studioId}::uuid, 'member')`);
await deps.db.execute(sql`insert into subscriptions (studio_id, user_id, status, current_period_end) values (${studioId}::uuid, 'viewer', 'active', now() + interval '30 days')`);
const rows = await deps.db.execute<{ id: string; lesson_id: string }>(sql`select id, lesson_id from recordings where studio_id = ${studioId}::uuid`);
const rec = rows.rows[0]!;
const lessonId = rec.lesson_id;
const segmentPaths = await packageInto(`studios/${studioId}/lessons/${lessonId}/recordings/${rec.id}/media/`);
await deps.db.execute(sql`update recordings set duration_seconds = ${CLASS_SECONDS} where id = ${rec.id}::uuid`);
await deps.pool.end();

const { base, stop } = await startBenchApp(PORT, benchUrl, { ROUNDMARK_APP_PROCESSES: '1' });
try {
  const cookie = await benchSignIn(base, 'viewer@fernhill.example', 'viewer password 1');
  const media = `${base}/media/${rec.id}/hls`;
  const check = await fetch(`${media}/${segmentPaths.variant}`, { headers: { cookie } });
  const listed = (await check.text()).split('\n').filter((l) => l && !l.startsWith('#'));
  if (!check.ok || listed.length !== CLASS_SECONDS / SEGMENT_SECONDS) throw new Error(`media playlist: ${check.status}, ${listed.length} links`);

  const get = (url: string, headers: Record<string, string> = {}): LoopRequest => ({ url, headers: { cookie, ...headers } });
  const progress: LoopRequest = {
    url: `${base}/api/lessons/${lessonId}/progress`,
    method: 'POST',
    headers: { cookie, origin: base, 'content-type': 'application/json' },
    body: JSON.stringify({ positionSeconds: 30, watched: [[25, 30]], event: 'progress' }),
  };
  /** One viewer's requests per second to the app, by kind. */
  const mix = (throughApp: boolean, withProgress: boolean) => [
    { rate: 1 / CLASS_SECONDS, make: () => get(`${media}/master.m3u8`) },
    { rate: 1 / CLASS_SECONDS, make: () => get(`${media}/${segmentPaths.variant}`) },
    ...(throughApp
      ? [{ rate: 1 / SEGMENT_SECONDS, make: (i: number) => get(`${media}/${segmentPaths.segments[i % segmentPaths.segments.length]}`, { range: 'bytes=0-' }) }]
      : []),
    ...(withProgress ? [{ rate: 1 / PROGRESS_SECONDS, make: () => progress }] : []),
  ];

  console.log(`viewers per app process (1 process; p99 of the app's answers ≤ ${P99_LIMIT_MS} ms; ${STEP_SECONDS} s per step, evenly spaced arrivals):`);
  const results: Record<string, string> = {};
  for (const withProgress of [false, true]) {
    for (const throughApp of [true, false]) {
      const name = `${throughApp ? 'before (segments through the app)' : 'after (segments from storage)'}${withProgress ? ', with progress reports every 5 s' : ''}`;
      results[name] = await ramp(name, mix(throughApp, withProgress));
    }
  }
  console.log('summary:');
  for (const [name, figure] of Object.entries(results)) console.log(`  ${name}: ${figure}`);
  console.log(`1-min load average at the end: ${(loadavg()[0] ?? 0).toFixed(2)} (2 cores; above 2 means other work competed)`);
} finally {
  stop();
}

/** Doubles the viewers until p99 passes the limit; answers the last count that held. */
async function ramp(name: string, kinds: { rate: number; make: (i: number) => LoopRequest }[]): Promise<string> {
  console.log(`  ${name}:`);
  const perViewer = kinds.reduce((sum, k) => sum + k.rate, 0);
  let held = 0;
  let first = 25;
  while (first * perViewer < START_RATE) first *= 2;
  for (let viewers = first; viewers <= MAX_VIEWERS; viewers *= 2) {
    const rate = viewers * perViewer;
    if (rate > MAX_RATE) {
      console.log(`    ${viewers} viewers would need ${Math.round(rate)} requests/s: past the sender's ${MAX_RATE}/s, stopped`);
      return `≥ ${held} viewers (the sender's limit, not the app's, was reached)`;
    }
    // Requests of each kind in proportion to their rates, interleaved (a deterministic mix).
    const counters = kinds.map(() => 0);
    const r = await openLoopMix((i) => {
      let best = 0;
      for (let k = 1; k < kinds.length; k++) if (counters[k]! / kinds[k]!.rate < counters[best]! / kinds[best]!.rate) best = k;
      counters[best]! += 1;
      return kinds[best]!.make(i);
    }, rate, Math.min(30, Math.max(STEP_SECONDS, MIN_SAMPLES / rate)));
    const ok = r.p99 <= P99_LIMIT_MS && r.failed <= r.sent * 0.001;
    console.log(`    ${viewers} viewers: ${rate.toFixed(1)} requests/s to the app, p50 ${r.p50} ms, p99 ${r.p99} ms, ${r.failed} failed of ${r.sent}${ok ? '' : '  <- over'}`);
    if (!ok) return `${held} viewers`;
    held = viewers;
  }
  return `≥ ${held} viewers (no limit below ${MAX_VIEWERS})`;
}

/** Packages a generated clip with the app's ladder, stretches the media playlists to 30 minutes, uploads it. */
async function packageInto(prefix: string): Promise<{ variant: string; segments: string[] }> {
  const dir = await mkdtemp(join(tmpdir(), 'roundmark-viewers-'));
  try {
    const source = join(dir, 'source.mp4');
    // Invented input: a test pattern and a tone, 40 s of 720p.
    await run('ffmpeg', ['-hide_banner', '-loglevel', 'error', '-y',
      '-f', 'lavfi', '-i', 'testsrc=duration=40:size=1280x720:rate=30', '-f', 'lavfi', '-i', 'sine=frequency=440:duration=40',
      '-c:v', 'libx264', '-preset', 'ultrafast', '-pix_fmt', 'yuv420p', '-c:a', 'aac', '-shortest', source]);
    const verdict = probeVerdict(await probeFile(source));
    if (!verdict.ok) throw new Error(verdict.reason);
    const out = join(dir, 'hls');
    await runFfmpeg(buildPackageArgs({ input: source, outputDir: out, probe: verdict.summary }), { durationSeconds: verdict.summary.durationSeconds });
    const files = (await readdir(out, { recursive: true })).map(String);
    const playlists = files.filter((f) => /^v\d+\/index\.m3u8$/.test(f));
    for (const playlist of playlists) {
      const folder = playlist.slice(0, playlist.lastIndexOf('/') + 1);
      const existing = files.filter((f) => f.startsWith(folder) && f.endsWith('.ts')).map((f) => f.slice(folder.length)).sort();
      const lines = ['#EXTM3U', '#EXT-X-VERSION:3', `#EXT-X-TARGETDURATION:${SEGMENT_SECONDS}`, '#EXT-X-PLAYLIST-TYPE:VOD', '#EXT-X-MEDIA-SEQUENCE:0'];
      for (let i = 0; i < CLASS_SECONDS / SEGMENT_SECONDS; i++) lines.push(`#EXTINF:${SEGMENT_SECONDS}.000000,`, existing[i % existing.length]!);
      lines.push('#EXT-X-ENDLIST', '');
      await writeFile(join(out, playlist), lines.join('\n'));
    }
    const { s3, bucket } = storage();
    for (const file of files.filter((f) => /\.(m3u8|ts)$/.test(f))) {
      await s3.send(new PutObjectCommand({ Bucket: bucket, Key: `${prefix}hls/${file}`, Body: await readFile(join(out, file)) }));
    }
    const variant = playlists.sort()[0]!;
    const folder = variant.slice(0, variant.lastIndexOf('/') + 1);
    const segments = files.filter((f) => f.startsWith(folder) && f.endsWith('.ts')).sort();
    console.log(`class: ${relative(dir, out)}: ${playlists.length} renditions, ${segments.length} segments of the first played through the app in "before"`);
    return { variant, segments };
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}
