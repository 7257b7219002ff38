/**
 * Packaging bench (issue 4, "Performance"): wall time of our runner (runFfmpeg with -progress
 * parsing) vs bare ffmpeg with the very same buildPackageArgs arguments, in the same run, on a
 * generated 5-minute 1080p30 clip (BENCH_QUICK=1: 30 s). Target ratio ≤ 1.15.
 *
 *   npx tsx bench/package-bench.ts
 */
import { execFile, spawn } from 'node:child_process';
import { mkdtemp, rm } from 'node:fs/promises';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { buildPackageArgs } from '~/lib/media/hls-ladder';
import { probeVerdict } from '~/lib/media/probe-verdict';
import { probeFile, runFfmpeg } from '~/server/media/ffmpeg-runner';

const run = promisify(execFile);
const seconds = process.env.BENCH_QUICK === '1' ? 30 : 300;
// The machine is shared: alternate the order across rounds and compare the best time of each.
const rounds = Number(process.env.BENCH_ROUNDS ?? (process.env.BENCH_QUICK === '1' ? 2 : 1));

/** Bare ffmpeg: output discarded, nothing parsed. */
function bare(args: string[]): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn('ffmpeg', args, { stdio: ['ignore', 'ignore', 'inherit'] });
    child.on('error', reject);
    child.on('close', (code) => (code === 0 ? resolve() : reject(new Error(`ffmpeg exited ${code}`))));
  });
}

async function main() {
  const dir = await mkdtemp(join(tmpdir(), 'roundmark-bench-'));
  try {
    const source = join(dir, 'source.mp4');
    console.log(`generating ${seconds} s of 1080p30 (testsrc + sine, ultrafast)…`);
    const t = performance.now();
    await run('ffmpeg', [
      '-hide_banner', '-loglevel', 'error', '-y',
      '-f', 'lavfi', '-i', `testsrc=duration=${seconds}:size=1920x1080:rate=30`,
      '-f', 'lavfi', '-i', `sine=frequency=1000:duration=${seconds}`,
      '-c:v', 'libx264', '-preset', 'ultrafast', '-pix_fmt', 'yuv420p', '-c:a', 'aac', '-shortest', source,
    ]);
    console.log(`  generated in ${((performance.now() - t) / 1000).toFixed(1)} s`);

    const verdict = probeVerdict(await probeFile(source));
    if (!verdict.ok) throw new Error(verdict.reason);
    const argsFor = (name: string) => buildPackageArgs({ input: source, outputDir: join(dir, name), probe: verdict.summary });

    const bareTimes: number[] = [];
    const runnerTimes: number[] = [];
    let reports = 0;
    let lastPercent = 0;
    const timeBare = async (r: number) => {
      const start = performance.now();
      await bare(argsFor(`bare-${r}`));
      bareTimes.push((performance.now() - start) / 1000);
    };
    const timeRunner = async (r: number) => {
      reports = 0;
      const start = performance.now();
      await runFfmpeg(argsFor(`runner-${r}`), {
        durationSeconds: verdict.summary.durationSeconds,
        onProgress: (p) => {
          reports += 1;
          lastPercent = p.percent;
        },
      });
      runnerTimes.push((performance.now() - start) / 1000);
    };
    const loadBefore = loadavg()[0] ?? 0;
    for (let r = 0; r < rounds; r++) {
      if (r % 2 === 0) {
        await timeBare(r);
        await timeRunner(r);
      } else {
        await timeRunner(r);
        await timeBare(r);
      }
    }
    const loadAfter = loadavg()[0] ?? 0;
    const bareSeconds = Math.min(...bareTimes);
    const runnerSeconds = Math.min(...runnerTimes);
    console.log(`runs (s): bare ${bareTimes.map((x) => x.toFixed(1)).join(', ')}; runner ${runnerTimes.map((x) => x.toFixed(1)).join(', ')}`);
    console.log(`1-min load average: ${loadBefore.toFixed(2)} before, ${loadAfter.toFixed(2)} after (2 cores; above 2 means other work competed)`);
    const ratio = runnerSeconds / bareSeconds;
    console.log(`clip: ${seconds} s 1080p30 → 1080p/720p/360p HLS (veryfast, 4 s segments)`);
    console.log(`bare ffmpeg (best): ${bareSeconds.toFixed(1)} s wall (${(seconds / bareSeconds).toFixed(2)}× real time)`);
    console.log(`runFfmpeg (best):   ${runnerSeconds.toFixed(1)} s wall (${(seconds / runnerSeconds).toFixed(2)}× real time), ${reports} progress reports, last ${lastPercent} %`);
    console.log(`ratio runner/bare: ${ratio.toFixed(3)} (target ≤ 1.15) ${ratio <= 1.15 ? 'OK' : 'OVER TARGET'}`);
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}

await main();
