/**
 * Parses ffmpeg's `-progress` output (blocks of key=value lines, each block ending in
 * `progress=continue` or `progress=end`) into a percentage of a known duration.
 */

/** One progress report, emitted at the end of each `-progress` block. */
export interface FfmpegProgress {
  /** 0–100, one decimal; 100 only when ffmpeg says `progress=end`. */
  percent: number;
  /** Output timestamp reached, seconds. */
  outTimeSeconds: number;
  /** ffmpeg's speed as a real-time factor (e.g. 1.3), when known. */
  speed?: number;
  done: boolean;
}

/** Percentage of `durationSeconds` reached at `outTimeSeconds`, capped below 100 until the end. */
export function progressPercent(outTimeSeconds: number, durationSeconds: number): number {
  if (!(durationSeconds > 0) || !(outTimeSeconds > 0)) return 0;
  // Capped at 99.9: muxers still flush after the last frame, so 100 means "files written".
  return Math.min(99.9, Math.floor((outTimeSeconds / durationSeconds) * 1000) / 10);
}

/**
 * A stateful parser: feed it stdout text in any chunking; it returns the reports completed by
 * that chunk. `out_time_us` is preferred; `out_time_ms` is also microseconds (a long-standing
 * ffmpeg naming quirk), and `out_time=HH:MM:SS.micro` is the fallback.
 */
export function createProgressParser(durationSeconds: number): (chunk: string) => FfmpegProgress[] {
  let pending = '';
  let outTime = 0;
  let speed: number | undefined;
  let blockHadMicros = false;
  return (chunk) => {
    pending += chunk;
    const lines = pending.split(/\r?\n/);
    pending = lines.pop() ?? '';
    const reports: FfmpegProgress[] = [];
    for (const line of lines) {
      const eq = line.indexOf('=');
      if (eq < 0) continue;
      const key = line.slice(0, eq).trim();
      const value = line.slice(eq + 1).trim();
      if (key === 'out_time_us' || key === 'out_time_ms') {
        const us = Number(value);
        if (value !== '' && Number.isFinite(us) && us >= 0) {
          outTime = us / 1e6;
          blockHadMicros = true;
        }
      } else if (key === 'out_time' && !blockHadMicros) {
        const t = parseClock(value);
        if (t !== undefined) outTime = t;
      } else if (key === 'speed') {
        const s = Number.parseFloat(value);
        speed = Number.isFinite(s) ? s : undefined;
      } else if (key === 'progress') {
        const done = value === 'end';
        blockHadMicros = false;
        const report: FfmpegProgress = {
          percent: done ? 100 : progressPercent(outTime, durationSeconds),
          outTimeSeconds: outTime,
          done,
        };
        if (speed !== undefined) report.speed = speed;
        reports.push(report);
      }
    }
    return reports;
  };
}

/** `HH:MM:SS.ffffff` (ffmpeg's out_time) to seconds. */
export function parseClock(value: string): number | undefined {
  const m = /^(-?)(\d+):(\d{2}):(\d{2}(?:\.\d+)?)$/.exec(value);
  if (!m) return undefined;
  const seconds = Number(m[2]) * 3600 + Number(m[3]) * 60 + Number(m[4]);
  return m[1] === '-' ? -seconds : seconds;
}
