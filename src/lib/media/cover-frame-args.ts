import { withToneMap } from './tone-map';

/**
 * Where the frame that a paused player shows at `atSeconds` starts. A player shows the last frame
 * that started at or before its time, while ffmpeg's input seek gives the first frame starting at
 * or after the seek time: so seek to that frame's start, rounded down to the millisecond (ffmpeg
 * reads 3 decimals; rounding up could land past the frame's start and take the next one). Without
 * a known frame rate the time is taken as it is.
 */
export function frameStartSeconds(atSeconds: number, frameRate: number | null | undefined): number {
  const seconds = frameRate && Number.isFinite(frameRate) && frameRate > 0 ? Math.floor(atSeconds * frameRate + 1e-6) / frameRate : atSeconds;
  return Math.floor(seconds * 1000 + 1e-6) / 1000;
}

/**
 * ffmpeg arguments for one cover picture from a moment of the recording: seeking before the input
 * (fast, and exact for a file input: ffmpeg decodes from the keyframe before and drops frames
 * until the time), one frame, cropped to fill the cover size like an uploaded picture, HDR sources
 * tone-mapped first, written as a JPEG.
 */
export function buildCoverFrameArgs(options: {
  input: string;
  output: string;
  atSeconds: number;
  frameRate?: number | null;
  width: number;
  height: number;
  colorTransfer?: string | null;
}): string[] {
  const fill = `scale=${options.width}:${options.height}:force_original_aspect_ratio=increase,crop=${options.width}:${options.height}`;
  return [
    '-hide_banner', '-nostdin', '-y', '-loglevel', 'error',
    '-ss', frameStartSeconds(options.atSeconds, options.frameRate).toFixed(3),
    '-i', options.input,
    '-frames:v', '1',
    '-vf', withToneMap(options.colorTransfer, fill),
    '-q:v', '3',
    options.output,
  ];
}
