/**
 * Sequence alignment of planned work intervals against marked work segments, so that one
 * missing or extra station shifts the pairing instead of flagging every later station
 * (which an index-by-index comparison would do).
 *
 * It is a Needleman–Wunsch style global alignment with edit costs: a gap (a planned station
 * with no mark, or a mark with no planned station) costs 1, a match costs 0 and is allowed
 * only when the names agree (a mark without an exercise name matches any station). Among
 * alignments with the fewest gaps, the one whose matched marks sit closest to their planned
 * times (relative to the class start) wins, which places a missing set of identical
 * intervals where the marks actually have a hole.
 *
 * Cost: the matrix is computed only in a diagonal band, doubled until the result is provably
 * optimal (any path leaving a band of half-width w has more than w gaps), so a timeline that
 * mostly follows its plan costs O((n + m) · w) instead of O(n · m).
 */

export interface AlignItem {
  /** Normalised exercise name, or null for a mark without a name (matches anything). */
  name: string | null;
  /** Start time relative to the class start, in seconds. */
  relativeStart: number;
}

/** One step of the alignment: indexes into the planned and marked lists, -1 for none. */
export interface AlignStep {
  planned: number;
  marked: number;
}

/** Names compare without case and with runs of spaces collapsed. */
export function normaliseExercise(name: string | undefined): string | null {
  if (name === undefined) return null;
  const n = name.trim().replace(/\s+/g, ' ').toLowerCase();
  return n === '' ? null : n;
}

/** Caps the timing tiebreak so one wild mark cannot dominate it. */
const MAX_TIME_PENALTY = 3600;

const DIAG = 1;
const UP = 2; // planned item unmatched (missing)
const LEFT = 3; // marked item unmatched (extra)

function alignInBand(planned: readonly AlignItem[], marked: readonly AlignItem[], w: number): { cost: number; steps: AlignStep[] } {
  const n = planned.length;
  const m = marked.length;
  const lo = Math.min(0, m - n) - w;
  const hi = Math.max(0, m - n) + w;
  const width = hi - lo + 1;
  const INF = 0x3fffffff;
  let prevGaps = new Int32Array(width).fill(INF);
  let prevTime = new Float64Array(width);
  let curGaps = new Int32Array(width);
  let curTime = new Float64Array(width);
  const trace = new Uint8Array((n + 1) * width);

  for (let i = 0; i <= n; i++) {
    curGaps.fill(INF);
    const jFrom = Math.max(0, i + lo);
    const jTo = Math.min(m, i + hi);
    for (let j = jFrom; j <= jTo; j++) {
      const k = j - i - lo;
      if (i === 0 && j === 0) {
        curGaps[k] = 0;
        curTime[k] = 0;
        continue;
      }
      let bestGaps = INF;
      let bestTime = 0;
      let dir = 0;
      if (i > 0 && j > 0) {
        const g = prevGaps[k]!;
        const p = planned[i - 1]!;
        const q = marked[j - 1]!;
        if (g < INF && (q.name === null || q.name === p.name)) {
          bestGaps = g;
          bestTime = prevTime[k]! + Math.min(Math.abs(q.relativeStart - p.relativeStart), MAX_TIME_PENALTY);
          dir = DIAG;
        }
      }
      if (i > 0 && k + 1 < width) {
        const g = prevGaps[k + 1]! + 1;
        const t = prevTime[k + 1]!;
        if (g < bestGaps || (g === bestGaps && t < bestTime)) {
          bestGaps = g;
          bestTime = t;
          dir = UP;
        }
      }
      if (j > 0 && k > 0) {
        const g = curGaps[k - 1]! + 1;
        const t = curTime[k - 1]!;
        if (g < bestGaps || (g === bestGaps && t < bestTime)) {
          bestGaps = g;
          bestTime = t;
          dir = LEFT;
        }
      }
      curGaps[k] = bestGaps;
      curTime[k] = bestTime;
      trace[i * width + k] = dir;
    }
    [prevGaps, curGaps] = [curGaps, prevGaps];
    [prevTime, curTime] = [curTime, prevTime];
  }

  const cost = prevGaps[m - n - lo]!;
  const steps: AlignStep[] = [];
  let i = n;
  let j = m;
  while (i > 0 || j > 0) {
    const dir = trace[i * width + (j - i - lo)];
    if (dir === DIAG) {
      steps.push({ planned: i - 1, marked: j - 1 });
      i--;
      j--;
    } else if (dir === UP) {
      steps.push({ planned: i - 1, marked: -1 });
      i--;
    } else {
      steps.push({ planned: -1, marked: j - 1 });
      j--;
    }
  }
  steps.reverse();
  return { cost, steps };
}

/**
 * Aligns planned work intervals with marked work segments (both in time order).
 * Returns the steps in order; every planned and every marked index appears exactly once.
 */
export function alignStations(planned: readonly AlignItem[], marked: readonly AlignItem[]): AlignStep[] {
  const longest = Math.max(planned.length, marked.length);
  for (let w = 8; ; w *= 2) {
    const { cost, steps } = alignInBand(planned, marked, w);
    // A path that leaves the band has more than w gaps, so cost <= w proves optimality.
    if (cost <= w || w >= longest) return steps;
  }
}
