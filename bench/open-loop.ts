import http from 'node:http';

/** Latency figures of one open-loop run. */
export interface OpenLoopResult {
  rate: number;
  sent: number;
  failed: number;
  p50: number;
  p99: number;
  max: number;
}

/** One request of an open-loop run. */
export interface LoopRequest {
  url: string;
  method?: 'GET' | 'POST';
  headers?: Record<string, string>;
  body?: string;
}

/**
 * Sends GET requests at a fixed arrival rate, evenly spaced (request i leaves at start + i/rate,
 * whatever happened to the ones before: open loop), over a small pool of kept-alive connections
 * that grows only when every connection is busy. This measures latency at a given load, unlike a
 * closed loop of N connections, whose latency is N ÷ throughput (Little's law).
 */
export function openLoop(url: string, headers: Record<string, string>, rate: number, seconds: number): Promise<OpenLoopResult> {
  return openLoopMix(() => ({ url, headers }), rate, seconds);
}

/** The same, with each request chosen by `next(i)` (a mix of requests at one overall rate). */
export async function openLoopMix(next: (i: number) => LoopRequest, rate: number, seconds: number): Promise<OpenLoopResult> {
  const agent = new http.Agent({ keepAlive: true, maxSockets: 256 });
  const total = Math.max(1, Math.round(rate * seconds));
  const latencies: number[] = [];
  let failed = 0;
  const start = performance.now() + 50;
  const pending: Promise<void>[] = [];
  for (let i = 0; i < total; i++) {
    const due = start + (i * 1000) / rate;
    const wait = due - performance.now();
    if (wait > 0) await new Promise((r) => setTimeout(r, wait));
    pending.push(
      once(next(i), agent).then(
        (ms) => void latencies.push(ms),
        () => void failed++,
      ),
    );
  }
  await Promise.all(pending);
  agent.destroy();
  latencies.sort((a, b) => a - b);
  const at = (q: number) => latencies[Math.min(latencies.length - 1, Math.floor(q * latencies.length))] ?? NaN;
  return { rate, sent: total, failed, p50: round(at(0.5)), p99: round(at(0.99)), max: round(latencies.at(-1) ?? NaN) };
}

function once(r: LoopRequest, agent: http.Agent): Promise<number> {
  const t0 = performance.now();
  return new Promise((resolve, reject) => {
    const req = http.request(r.url, { agent, method: r.method ?? 'GET', headers: r.headers }, (res) => {
      res.resume();
      res.on('end', () => (res.statusCode && res.statusCode < 400 ? resolve(performance.now() - t0) : reject(new Error(String(res.statusCode)))));
    });
    req.on('error', reject);
    req.end(r.body);
  });
}

const round = (ms: number) => Math.round(ms * 10) / 10;
