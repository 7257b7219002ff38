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

/** The colours of {@link makeColourClip}, 4 s each in this order: invented test truth. */
export const COLOUR_CLIP = [
  { name: 'red', from: 0, to: 4, rgb: [255, 0, 0] },
  { name: 'blue', from: 4, to: 8, rgb: [0, 0, 255] },
  { name: 'green', from: 8, to: 12, rgb: [0, 255, 0] },
] as const;

/**
 * A 12 s clip (recordings must last 10 s at least) whose picture is one known colour per time
 * (invented test input with known truth): red 0–4 s, blue 4–8 s, green 8–12 s, 25 frames a
 * second, 320 × 180, with a 1 kHz tone.
 */
export async function makeColourClip(path: string) {
  const inputs = COLOUR_CLIP.flatMap((c) => ['-f', 'lavfi', '-i', `color=c=${c.name === 'green' ? 'lime' : c.name}:s=320x180:r=25:d=${c.to - c.from}`]);
  await ffmpeg(
    ...inputs,
    '-f', 'lavfi', '-i', 'sine=frequency=1000:duration=12',
    '-filter_complex', '[0:v][1:v][2:v]concat=n=3:v=1:a=0[v]', '-map', '[v]', '-map', '3:a',
    '-c:v', 'libx264', '-preset', 'ultrafast', '-pix_fmt', 'yuv420p', '-c:a', 'aac', path,
  );
}

/** Size and mean colour of a picture file, read by ffprobe and ffmpeg (scaled to one pixel). */
export async function pictureFacts(file: string): Promise<{ size: string; rgb: number[] }> {
  const probe = await run('ffprobe', ['-v', 'error', '-select_streams', 'v:0', '-show_entries', 'stream=codec_name,width,height', '-of', 'csv=p=0', file]);
  const pixel = await run('ffmpeg', ['-v', 'error', '-i', file, '-vf', 'scale=1:1:flags=area', '-f', 'rawvideo', '-pix_fmt', 'rgb24', '-'], { encoding: 'buffer' });
  return { size: probe.stdout.toString().trim(), rgb: [...pixel.stdout] };
}

/** The clip's colour at a time (a frame showing at `seconds` started at or before it). */
export const colourAt = (seconds: number) => COLOUR_CLIP.find((c) => seconds >= c.from && seconds < c.to)!;
