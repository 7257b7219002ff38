/**
 * Percentile of a sliding window of dB values, by a whole-dB histogram: adding, removing and
 * asking are O(range) at worst and O(1) typically, so a 90-minute recording's 540 000 frames cost
 * nothing. Values are clamped to [lo, hi].
 */
export class RunningPercentile {
  private readonly counts: Int32Array;
  size = 0;

  constructor(
    private readonly lo: number,
    private readonly hi: number,
  ) {
    this.counts = new Int32Array(hi - lo + 1);
  }

  private bucket(db: number): number {
    return Math.max(0, Math.min(this.hi - this.lo, Math.round(db) - this.lo));
  }

  add(db: number): void {
    const b = this.bucket(db);
    this.counts[b] = (this.counts[b] as number) + 1;
    this.size++;
  }

  remove(db: number): void {
    const b = this.bucket(db);
    this.counts[b] = (this.counts[b] as number) - 1;
    this.size--;
  }

  /** The value below which a share `p` (0–1) of the window lies, to the whole dB. */
  percentile(p: number): number {
    const target = Math.max(1, Math.ceil(p * this.size));
    let seen = 0;
    for (let b = 0; b < this.counts.length; b++) {
      seen += this.counts[b] as number;
      if (seen >= target) return b + this.lo;
    }
    return this.hi;
  }
}
