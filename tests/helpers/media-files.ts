import { execFile } from 'node:child_process';
import { promisify } from 'node:util';

const run = promisify(execFile);

/** The test's own ffmpeg calls (independent of the code under test) to make small media. */
export async function ffmpeg(...args: string[]): Promise<void> {
  await run('ffmpeg', ['-hide_banner', '-loglevel', 'error', '-y', ...args], { maxBuffer: 16 * 1024 * 1024 });
}

/**
 * A test-pattern clip with a tone, x264 + AAC in MP4. `lossless` adds moving noise and encodes
 * without loss, so even a short clip is many megabytes (for tests that need several 5 MiB parts).
 */
export async function makeClip(path: string, opts: { seconds: number; size?: string; lossless?: boolean; audio?: boolean }) {
  const args = ['-f', 'lavfi', '-i', `testsrc=duration=${opts.seconds}:size=${opts.size ?? '640x360'}:rate=30`];
  if (opts.audio !== false) args.push('-f', 'lavfi', '-i', `sine=frequency=1000:duration=${opts.seconds}`);
  if (opts.lossless) args.push('-vf', 'noise=alls=60:allf=t');
  args.push('-c:v', 'libx264', '-preset', 'ultrafast', '-pix_fmt', 'yuv420p');
  if (opts.lossless) args.push('-qp', '0');
  if (opts.audio !== false) args.push('-c:a', 'aac');
  await ffmpeg(...args, path);
}
