/**
 * Benchmark of the timing check (issue: "Performance"): a 3-hour timeline of 2,000 segments
 * and 5,000 cues. Prints the median check time and its ratio to merely sorting the same
 * segments and cues in the same run (targets: median < 5 ms, ratio < 10).
 * Run: npx tsx bench/timing-check-bench.ts
 */
import { expandPlan } from '~/lib/plan/expand-plan';
import { planSchema } from '~/lib/plan/plan-schema';
import type { Cue, Segment, Timeline } from '~/lib/timeline/timeline-schema';
import { checkTiming } from '~/lib/timing/timing-check';

// 600 s warm-up, 60 s talk, 9 stations × (6 s work + 3 s rest) × 111 rounds with 8 s round
// breaks, 600 s cool-down: 2,000 segments, 10,798 s (just under 3 hours).
const plan = planSchema.parse({
  blocks: [
    { kind: 'warmup', seconds: 600 },
    { kind: 'talk', seconds: 60 },
    {
      kind: 'circuit',
      rounds: 111,
      roundBreakSeconds: 8,
      stations: Array.from({ length: 9 }, (_, i) => ({ exercise: `Station ${i + 1}`, workSeconds: 6, restSeconds: 3 })),
    },
    { kind: 'cooldown', seconds: 600 },
  ],
});
const schedule = expandPlan(plan, 5);

// A deterministic pseudo-random source, so every run measures the same input.
let seed = 42;
const random = (): number => {
  seed = (seed * 1103515245 + 12345) % 2147483648;
  return seed / 2147483648;
};

const segments: Segment[] = schedule.segments.map((p, i) => ({
  id: `s${i}`,
  kind: p.kind,
  startSeconds: p.startSeconds,
  endSeconds: p.startSeconds + p.seconds,
  ...(p.exercise && p.kind === 'work' ? { exercise: p.exercise } : {}),
}));
// Realistic mistakes: some boundaries off by a few seconds, one station left out.
for (let k = 0; k < 40; k++) {
  const i = 2 + Math.floor(random() * (segments.length - 4));
  const a = segments[i]!;
  const b = segments[i + 1]!;
  const at = Math.round((a.endSeconds + (random() - 0.5) * 2) * 1000) / 1000;
  if (at > a.startSeconds && at < b.endSeconds) {
    a.endSeconds = at;
    b.startSeconds = at;
  }
}
segments.splice(1000, 2);
// An intro and an outro bring it back to 2,000 segments.
segments.unshift({ id: 'intro', kind: 'intro', startSeconds: 0, endSeconds: 5 });
const lastEnd = segments[segments.length - 1]!.endSeconds;
segments.push({ id: 'outro', kind: 'outro', startSeconds: lastEnd, endSeconds: lastEnd + 20 });
const end = lastEnd + 20;
// Cues as a coach places them: a countdown 3 s before most work intervals (a few late),
// coaching notes anywhere in the class.
const workStarts = segments.filter((s) => s.kind === 'work').map((s) => s.startSeconds);
const noteKinds: Cue['kind'][] = ['form', 'option', 'safety', 'note'];
const cues: Cue[] = Array.from({ length: 5000 }, (_, i) => {
  const countdownAt = workStarts[i % workStarts.length]!;
  const isCountdown = i < workStarts.length;
  return {
    id: `c${i}`,
    atSeconds: isCountdown ? Math.max(0, countdownAt - 3 + (random() < 0.02 ? 4 : 0)) : Math.round(random() * end * 1000) / 1000,
    kind: isCountdown ? 'countdown' : noteKinds[i % noteKinds.length]!,
    text: 'Keep the chest up',
  };
});
// Stored order is not time order.
segments.sort(() => random() - 0.5);
cues.sort(() => random() - 0.5);
const timeline: Timeline = { segments, cues };

const median = (values: number[]): number => {
  const s = [...values].sort((a, b) => a - b);
  const mid = s.length >> 1;
  return s.length % 2 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2;
};

const RUNS = 200;
let sink = 0;
const sortOnce = (): void => {
  const a = [...timeline.segments].sort((x, y) => x.startSeconds - y.startSeconds || x.endSeconds - y.endSeconds);
  const b = [...timeline.cues].sort((x, y) => x.atSeconds - y.atSeconds);
  sink += a.length + b.length;
};
const checkOnce = (): void => {
  sink += checkTiming(plan, timeline, { mediaSeconds: end + 10, advertisedMinutes: 180 }).findings.length;
};

// Warm up both so the JIT has compiled them, then interleave the measured runs.
for (let i = 0; i < 30; i++) {
  sortOnce();
  checkOnce();
}
const checkTimes: number[] = [];
const sortTimes: number[] = [];
for (let i = 0; i < RUNS; i++) {
  let t0 = performance.now();
  checkOnce();
  checkTimes.push(performance.now() - t0);
  t0 = performance.now();
  sortOnce();
  sortTimes.push(performance.now() - t0);
}

const result = checkTiming(plan, timeline, { mediaSeconds: end + 10, advertisedMinutes: 180 });
const checkMedian = median(checkTimes);
const sortMedian = median(sortTimes);
console.log(`timing check: ${timeline.segments.length} segments, ${timeline.cues.length} cues, ${Math.round(end)} s of class`);
console.log(`timing check findings: ${result.findings.length}`);
console.log(`timing check median: ${checkMedian.toFixed(3)} ms over ${RUNS} runs (target < 5 ms)`);
console.log(`sort baseline median: ${sortMedian.toFixed(3)} ms`);
console.log(`timing check ratio to sort: ${(checkMedian / sortMedian).toFixed(2)} (target < 10)`);
if (sink < 0) console.log(sink);
