import { describe, expect, it } from 'vitest';
import { buildCoverFrameArgs, frameStartSeconds } from '~/lib/media/cover-frame-args';
import { isInsideRecording } from '~/lib/publishing/cover-frame';

describe('the frame a paused player shows', () => {
  it('seeks to the start of the frame on screen, not the next one', () => {
    // At 25 fps frames start every 0.04 s (worked by hand): 1.97 s shows the frame from 1.96 s.
    expect(frameStartSeconds(1.97, 25)).toBe(1.96);
    expect(frameStartSeconds(2, 25)).toBe(2);
    expect(frameStartSeconds(5.999, 25)).toBe(5.96);
    // At 30 fps the second frame starts at 1/30 = 0.0333… s: rounded down to 0.033, so ffmpeg's
    // "first frame at or after" still finds that frame and not the third (0.0667 s).
    expect(frameStartSeconds(0.05, 30)).toBe(0.033);
    expect(frameStartSeconds(2 / 30, 30)).toBe(0.066);
  });
  it('takes the time as it is when the frame rate is unknown', () => {
    expect(frameStartSeconds(12.3456, null)).toBe(12.345);
    expect(frameStartSeconds(12.3456, 0)).toBe(12.345);
  });
  it('builds one seek-before-input, one-frame, crop-to-fill command', () => {
    const args = buildCoverFrameArgs({ input: 'in.mp4', output: 'out.jpg', atSeconds: 1.97, frameRate: 25, width: 1280, height: 720 });
    expect(args.slice(args.indexOf('-ss'), args.indexOf('-ss') + 4)).toEqual(['-ss', '1.960', '-i', 'in.mp4']);
    expect(args[args.indexOf('-frames:v') + 1]).toBe('1');
    expect(args[args.indexOf('-vf') + 1]).toBe('scale=1280:720:force_original_aspect_ratio=increase,crop=1280:720');
    expect(args.at(-1)).toBe('out.jpg');
    const hdr = buildCoverFrameArgs({ input: 'in.mp4', output: 'out.jpg', atSeconds: 1, width: 1280, height: 720, colorTransfer: 'smpte2084' });
    expect(hdr[hdr.indexOf('-vf') + 1]).toMatch(/tonemap.*crop=1280:720$/);
  });
  it('a moment is inside the recording from its start up to, not including, its end', () => {
    expect(isInsideRecording(0, 6)).toBe(true);
    expect(isInsideRecording(5.99, 6)).toBe(true);
    expect(isInsideRecording(6, 6)).toBe(false);
    expect(isInsideRecording(-0.001, 6)).toBe(false);
  });
});
