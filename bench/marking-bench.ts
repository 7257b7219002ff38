/**
 * Benchmark of "Mark it for me" (issue 13), on generated recordings invented for the bench:
 * - analysis time (decode + events) of a 30-minute class and its ratio to a bare ffmpeg decode
 *   of the same audio to PCM in the same run (target ≤ 1.5×); also peaks + events from one
 *   decode against the separate peaks decode packaging runs today;
 * - proposal time for about 60 boundaries (target < 200 ms);
 * - accuracy (share of true boundaries within 0.5 s) for timer beeps, whistle and spoken count,
 *   over several seeds (targets 97 %, 95 %, 80 %).
 * BENCH_QUICK=1 uses a 10-minute recording and one seed.
 * Run: npx tsx bench/marking-bench.ts
 */
import { mkdtemp, rm } from 'node:fs/promises';
import { availableParallelism, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { ANALYSIS_SAMPLE_RATE } from '~/lib/audio/analyze-audio';
import { proposeTimeline } from '~/lib/marking/propose-timeline';
import { scoreSoundtrack, type ChangeSignal } from '~/lib/media/class-soundtrack';
import { buildMonoPcmArgs } from '~/lib/media/pcm-args';
import { expandPlan } from '~/lib/plan/expand-plan';
import { planSchema } from '~/lib/plan/plan-schema';
import { analyzeRecordingAudio } from '~/server/media/analyze-recording-audio';
import { computeFilePeaks, runFfmpeg } from '~/server/media/ffmpeg-runner';
import { renderSoundtrack } from '~/server/media/render-soundtrack';
import { ACCURACY_PLAN, matchedShare } from '../tests/helpers/marking-fixtures';

const quick = process.env.BENCH_QUICK === '1';
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const ms = (x: number) => `${x.toFixed(0)} ms`;

async function timed<T>(run: () => Promise<T>): Promise<[T, number]> {
  const t = performance.now();
  const value = await run();
  return [value, performance.now() - t];
}

// 3 min warm-up, 6 stations × (30 s work + 15 s rest) × 5 rounds with 45 s round breaks, 3 min
// cool-down: 61 parts, 62 boundaries, 30 min 15 s (quick: 2 rounds, about 12 minutes).
const longPlan = planSchema.parse({
  blocks: [
    { kind: 'warmup', seconds: 180 },
    {
      kind: 'circuit',
      rounds: quick ? 2 : 5,
      roundBreakSeconds: 45,
      stations: ['Squats', 'Push-ups', 'Lunges', 'Plank', 'Burpees', 'Mountain climbers'].map((exercise) => ({ exercise, workSeconds: 30, restSeconds: 15 })),
    },
    { kind: 'cooldown', seconds: 180 },
  ],
});

const dir = await mkdtemp(join(tmpdir(), 'roundmark-marking-bench-'));
const clips = new Map<string, Float32Array>();
try {
  const score = scoreSoundtrack(expandPlan(longPlan).segments, { signal: 'beeps', seed: 5 });
  const file = join(dir, 'class.m4a');
  const [, renderMs] = await timed(() => renderSoundtrack(score, file, { clips }));
  console.log(`recording: ${(score.durationSeconds / 60).toFixed(1)} min AAC 96 kb/s (audio only, the cheapest decode), ${score.boundaries.length} boundaries; generated in ${ms(renderMs)}`);

  // Alternate the runs so a busy moment on the machine hits both sides alike.
  const bare: number[] = [];
  const analysis: number[] = [];
  /** CPU time of this process (reading the decoder's output + the analysis) during each analysis run. */
  const analysisCpu: number[] = [];
  const peaksOnly: number[] = [];
  const combined: number[] = [];
  let events: Awaited<ReturnType<typeof analyzeRecordingAudio>>['events'] = [];
  const args = buildMonoPcmArgs({ input: file, sampleRate: ANALYSIS_SAMPLE_RATE });
  for (let round = 0; round < 3; round++) {
    bare.push((await timed(() => runFfmpeg(args, { onStdout: () => {} })))[1]);
    const cpu = process.cpuUsage();
    const [result, t] = await timed(() => analyzeRecordingAudio(file));
    const used = process.cpuUsage(cpu);
    analysisCpu.push((used.user + used.system) / 1000);
    analysis.push(t);
    events = result.events;
    peaksOnly.push((await timed(() => computeFilePeaks(file, 100)))[1]);
    combined.push((await timed(() => analyzeRecordingAudio(file, { peaksRate: 100 })))[1]);
  }
  const ratio = median(analysis) / median(bare);
  console.log(`bare ffmpeg decode to ${ANALYSIS_SAMPLE_RATE} Hz PCM: median ${ms(median(bare))} (${bare.map(ms).join(', ')})`);
  console.log(`analysis (decode + events): median ${ms(median(analysis))} (${analysis.map(ms).join(', ')}) = ${ratio.toFixed(2)}× the bare decode (target ≤ 1.5×) ${ratio <= 1.5 ? 'OK' : 'OVER'}`);
  console.log(
    `  of which this process's CPU (reading PCM, spectra, events): median ${ms(median(analysisCpu))}; ffmpeg decodes in its own process, so on a free second core the two overlap` +
      ` (load average now ${loadavg()[0]!.toFixed(1)} on ${availableParallelism()} cores)`,
  );
  console.log(`peaks alone (today's separate 8 kHz decode): median ${ms(median(peaksOnly))}; peaks + events from one decode: median ${ms(median(combined))}; two passes would take ${ms(median(peaksOnly) + median(analysis))}`);
  const counts: Record<string, number> = {};
  for (const e of events) counts[e.kind] = (counts[e.kind] ?? 0) + 1;
  console.log(`events: ${events.length} (${Object.entries(counts).map(([k, n]) => `${k} ${n}`).join(', ')})`);

  const proposeTimes: number[] = [];
  let proposal = proposeTimeline(longPlan, events, score.durationSeconds);
  for (let i = 0; i < 20; i++) {
    const t = performance.now();
    proposal = proposeTimeline(longPlan, events, score.durationSeconds);
    proposeTimes.push(performance.now() - t);
  }
  const p = median(proposeTimes);
  console.log(`proposal for ${proposal.boundaries.length} boundaries: median ${p.toFixed(1)} ms, max ${Math.max(...proposeTimes).toFixed(1)} ms over 20 runs (target < 200 ms) ${p < 200 ? 'OK' : 'OVER'}`);
  console.log(`  its accuracy: ${(100 * matchedShare(score.boundaries, proposal.boundaries.map((b) => b.atSeconds))).toFixed(1)} % within 0.5 s`);

  // Accuracy over seeds: the 12-minute class of the accuracy tests, three ways.
  const targets: Record<ChangeSignal, number> = { beeps: 0.97, whistle: 0.95, count: 0.8 };
  const seeds = quick ? [42] : [42, 7, 1234];
  for (const signal of ['beeps', 'whistle', 'count'] as ChangeSignal[]) {
    const shares: number[] = [];
    const errors: number[] = [];
    for (const seed of seeds) {
      const s = scoreSoundtrack(expandPlan(ACCURACY_PLAN).segments, { signal, seed });
      const f = join(dir, `${signal}-${seed}.m4a`);
      await renderSoundtrack(s, f, { clips, seed });
      const { events: ev } = await analyzeRecordingAudio(f);
      const got = proposeTimeline(ACCURACY_PLAN, ev, s.durationSeconds).boundaries.map((b) => b.atSeconds);
      shares.push(matchedShare(s.boundaries, got));
      s.boundaries.forEach((b, i) => {
        if (got[i] !== undefined && Math.abs(got[i] - b) <= 0.5) errors.push(Math.abs(got[i] - b));
      });
    }
    const worst = Math.min(...shares);
    console.log(
      `accuracy ${signal}: ${shares.map((x) => `${(100 * x).toFixed(1)} %`).join(', ')} (seeds ${seeds.join(', ')}; target ${targets[signal] * 100} %) ${worst >= targets[signal] ? 'OK' : 'UNDER'}; ` +
        `median error of matched boundaries ${(1000 * median(errors)).toFixed(0)} ms`,
    );
  }
} finally {
  await rm(dir, { recursive: true, force: true });
}
