import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  buildPackageArgs,
  buildPeaksArgs,
  buildPosterArgs,
  chooseLadder,
  fitShortSide,
  outputFrameRate,
} from '~/lib/media/hls-ladder';
import { buildDemoVideoArgs, escapeFilterValue, placeDemoSpans, textColorFor } from '~/scripts/demo/demo-video-args';
import { createProgressParser, parseClock } from '~/lib/media/progress';

// Expected argument lists are written out by hand (bit rates worked on paper from the documented
// rule: 0.08 bit/pixel at 1080p30 times (1080p pixels / pixels)^0.25, rounded to 50 kbit/s).
describe('buildPackageArgs', () => {
  it('pins the one-pass ladder for a 1080p30 source with audio', () => {
    const args = buildPackageArgs({
      input: '/in/class.mp4',
      outputDir: '/out/rec-1/',
      probe: { width: 1920, height: 1080, frameRate: 30, hasAudio: true },
    });
    expect(args).toEqual([
      '-hide_banner', '-nostdin', '-y', '-loglevel', 'error', '-nostats', '-progress', 'pipe:1',
      '-i', '/in/class.mp4',
      '-filter_complex',
      '[0:v:0]fps=30,format=yuv420p,split=3[s0][s1][s2];[s0]scale=1920:1080[v0];[s1]scale=1280:720[v1];[s2]scale=640:360[v2]',
      '-map', '[v0]', '-map', '0:a:0', '-map', '[v1]', '-map', '0:a:0', '-map', '[v2]', '-map', '0:a:0',
      '-c:v', 'libx264', '-preset', 'veryfast', '-profile:v', 'high',
      '-g', '120', '-keyint_min', '120', '-sc_threshold', '0',
      '-b:v:0', '5000k', '-maxrate:v:0', '5350k', '-bufsize:v:0', '7500k',
      '-b:v:1', '2700k', '-maxrate:v:1', '2900k', '-bufsize:v:1', '4050k',
      '-b:v:2', '950k', '-maxrate:v:2', '1000k', '-bufsize:v:2', '1450k',
      '-c:a', 'aac', '-ac', '2', '-ar', '48000', '-b:a:0', '128k', '-b:a:1', '128k', '-b:a:2', '96k',
      '-f', 'hls', '-hls_time', '4', '-hls_playlist_type', 'vod', '-hls_flags', 'independent_segments',
      '-hls_segment_type', 'mpegts', '-hls_segment_filename', '/out/rec-1/v%v/seg_%03d.ts',
      '-master_pl_name', 'master.m3u8',
      '-var_stream_map', 'v:0,a:0 v:1,a:1 v:2,a:2',
      '/out/rec-1/v%v/index.m3u8',
    ]);
  });

  it('pins the ladder for a 360p source without audio, 6 s segments, 25 fps', () => {
    const args = buildPackageArgs({
      input: 'in.webm',
      outputDir: 'out',
      probe: { width: 640, height: 360, frameRate: 25, hasAudio: false },
      segmentSeconds: 6,
      preset: 'ultrafast',
    });
    // 240p: 426x240 (640·240/360 = 426.7 → even 426); 25 fps → GOP 6·25 = 150.
    // 640x360@25: 230400·25·0.13856 = 798 → 800k; 426x240@25: 102240·25·0.16978 = 434 → 450k.
    expect(args).toEqual([
      '-hide_banner', '-nostdin', '-y', '-loglevel', 'error', '-nostats', '-progress', 'pipe:1',
      '-i', 'in.webm',
      '-filter_complex', '[0:v:0]fps=25,format=yuv420p,split=2[s0][s1];[s0]scale=640:360[v0];[s1]scale=426:240[v1]',
      '-map', '[v0]', '-map', '[v1]',
      '-c:v', 'libx264', '-preset', 'ultrafast', '-profile:v', 'high',
      '-g', '150', '-keyint_min', '150', '-sc_threshold', '0',
      '-b:v:0', '800k', '-maxrate:v:0', '850k', '-bufsize:v:0', '1200k',
      '-b:v:1', '450k', '-maxrate:v:1', '500k', '-bufsize:v:1', '700k',
      '-f', 'hls', '-hls_time', '6', '-hls_playlist_type', 'vod', '-hls_flags', 'independent_segments',
      '-hls_segment_type', 'mpegts', '-hls_segment_filename', 'out/v%v/seg_%03d.ts',
      '-master_pl_name', 'master.m3u8',
      '-var_stream_map', 'v:0 v:1',
      'out/v%v/index.m3u8',
    ]);
  });

  it('keeps -var_stream_map and its value as two separate array items (facts.md pitfall)', () => {
    const args = buildPackageArgs({ input: 'a', outputDir: 'o', probe: { width: 1280, height: 720, hasAudio: true } });
    const at = args.indexOf('-var_stream_map');
    expect(at).toBeGreaterThan(0);
    expect(args[at + 1]).toBe('v:0,a:0 v:1,a:1 v:2,a:2');
    expect(args.filter((a) => a.includes('v:1,a:1'))).toHaveLength(1);
  });

  it.each([3, 7, 4.5, 0])('refuses segment length %s (issue 4 asks for 4–6 s)', (segmentSeconds) => {
    expect(() =>
      buildPackageArgs({ input: 'a', outputDir: 'o', probe: { width: 640, height: 360, hasAudio: true }, segmentSeconds }),
    ).toThrow(RangeError);
  });

  it('keyframe interval equals segment length × output frame rate (60 fps capped to 30)', () => {
    const args = buildPackageArgs({
      input: 'a', outputDir: 'o', probe: { width: 1920, height: 1080, frameRate: 59.94, hasAudio: true }, segmentSeconds: 5,
    });
    expect(args[args.indexOf('-g') + 1]).toBe('150');
    expect(args[args.indexOf('-keyint_min') + 1]).toBe('150');
    expect(args[args.indexOf('-filter_complex') + 1]).toMatch(/^\[0:v:0\]fps=30,/);
  });
});

describe('chooseLadder', () => {
  it.each([
    // [source w, h, expected renditions "WxH"]
    [3840, 2160, ['1920x1080', '1280x720', '640x360']],
    [1920, 1080, ['1920x1080', '1280x720', '640x360']],
    [1280, 720, ['1280x720', '640x360', '426x240']],
    [854, 480, ['854x480', '640x360', '428x240']], // 427 → nearest even, ties up
    [960, 540, ['960x540', '640x360', '426x240']],
    [640, 360, ['640x360', '426x240']],
    [426, 240, ['426x240']],
    [853, 479, ['852x478', '642x360', '428x240']], // odd source trimmed down, not up
    [1080, 1920, ['1080x1920', '720x1280', '360x640']],
    [1440, 1080, ['1440x1080', '960x720', '480x360']],
  ] as const)('%i x %i → %j', (width, height, expected) => {
    expect(chooseLadder({ width, height, frameRate: 30 }).map((r) => `${r.width}x${r.height}`)).toEqual(expected);
  });

  it('never goes above the source, keeps sizes even and the aspect ratio within rounding (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 120, max: 4096 }), fc.integer({ min: 120, max: 4096 }), (width, height) => {
        const ladder = chooseLadder({ width, height });
        expect(ladder.length).toBeGreaterThan(0);
        for (const r of ladder) {
          expect(r.width % 2).toBe(0);
          expect(r.height % 2).toBe(0);
          expect(r.width).toBeLessThanOrEqual(width);
          expect(r.height).toBeLessThanOrEqual(height);
          expect(Math.min(r.width, r.height)).toBeLessThanOrEqual(1080);
          // Aspect kept: even rounding of sides ≥ 120 px moves the ratio by under 1.5 %.
          const error = Math.abs(r.width / r.height - width / height) / (width / height);
          expect(error).toBeLessThan(0.015);
        }
        // Strictly decreasing sizes, bit rates too.
        for (let i = 1; i < ladder.length; i++) {
          expect(ladder[i]!.height * ladder[i]!.width).toBeLessThan(ladder[i - 1]!.height * ladder[i - 1]!.width);
          expect(ladder[i]!.videoKbps).toBeLessThan(ladder[i - 1]!.videoKbps);
        }
      }),
    );
  });

  it.each([
    [undefined, 30], [29.97, 30], [23.976, 24], [25, 25], [60, 30], [0, 30],
  ])('output frame rate for source %s fps is %i', (frameRate, expected) => {
    expect(outputFrameRate(frameRate === undefined ? {} : { frameRate })).toBe(expected);
  });

  it('fitShortSide keeps the source size when asked for more than it has', () => {
    expect(fitShortSide({ width: 640, height: 360 }, 720)).toEqual({ width: 640, height: 360 });
  });
});

describe('buildPosterArgs and buildPeaksArgs', () => {
  it('takes one JPEG at 10 % of the duration, at most 720p', () => {
    expect(
      buildPosterArgs({ input: 'in.mp4', output: '/o/poster.jpg', probe: { width: 1920, height: 1080, durationSeconds: 1800 } }),
    ).toEqual([
      '-hide_banner', '-nostdin', '-y', '-loglevel', 'error', '-ss', '180.000', '-i', 'in.mp4', '-map', '0:v:0',
      '-frames:v', '1', '-vf', 'scale=1280:720', '-q:v', '3', '-f', 'image2', '-update', '1', '/o/poster.jpg',
    ]);
  });

  it('measures loudness and decodes the first audio stream to mono s16le at 8 kHz on stdout', () => {
    expect(buildPeaksArgs({ input: 'in.mp4' })).toEqual([
      '-hide_banner', '-nostdin', '-nostats', '-loglevel', 'info', '-i', 'in.mp4', '-map', '0:a:0', '-vn',
      // ITU-R BS.1770-4 / EBU R 128 integrated loudness, summary printed at info level.
      '-af', 'ebur128=framelog=verbose',
      '-ac', '1', '-ar', '8000', '-c:a', 'pcm_s16le', '-f', 's16le', 'pipe:1',
    ]);
  });

  it('cuts the PCM to the probed duration when given (AAC end padding)', () => {
    const args = buildPeaksArgs({ input: 'in.mp4', durationSeconds: 12 });
    expect(args.slice(args.indexOf('-t'), args.indexOf('-t') + 2)).toEqual(['-t', '12.000000']);
    expect(args.indexOf('-t')).toBeGreaterThan(args.indexOf('-i'));
  });
});

describe('demo video arguments', () => {
  it('escapes drawtext values for both filtergraph levels (ffmpeg docs, "Notes on filtergraph escaping")', () => {
    // Option level: 'It'\''s'; graph level then backslash-escapes \ ' [ ] , ;
    expect(escapeFilterValue("It's")).toBe("\\'It\\'\\\\\\'\\'s\\'");
    expect(escapeFilterValue('a:b')).toBe("\\'a:b\\'");
    expect(escapeFilterValue('50%')).toBe("\\'50%\\'");
    expect(escapeFilterValue('x\\y')).toBe("\\'x\\\\y\\'");
    expect(escapeFilterValue('[a],b;c')).toBe("\\'\\[a\\]\\,b\\;c\\'");
  });

  it('places spans on the 30 fps frame grid without drift', () => {
    const placed = placeDemoSpans(
      [{ label: 'a', seconds: 1.01 }, { label: 'b', seconds: 1.01 }, { label: 'c', seconds: 1.01 }],
      30,
    );
    // Cumulative 1.01, 2.02, 3.03 s → frames round(30.3)=30, round(60.6)=61, round(90.9)=91.
    expect(placed.map((p) => p.frames)).toEqual([30, 31, 30]);
    expect(placed.map((p) => p.endSeconds)).toEqual([1, 61 / 30, 91 / 30]);
  });

  it('keeps the command line short for a 64-span class: the graph goes to a script file', () => {
    const spans = Array.from({ length: 64 }, (_, i) => ({ label: `WORK  Move ${i}  round ${i % 4}/4`, seconds: 30, color: '#E4572E' }));
    const cmd = buildDemoVideoArgs({ spans, output: '/w/demo.mp4', workDir: '/w' });
    expect(cmd.args.join(' ').length).toBeLessThan(400);
    expect(cmd.args).toContain('-filter_complex_script');
    expect(cmd.args[cmd.args.indexOf('-filter_complex_script') + 1]).toBe('/w/demo-filter.txt');
    expect(cmd.files).toHaveLength(1);
    expect(cmd.files[0]!.content).toContain('concat=n=64:v=1:a=1[v][a]');
    expect(cmd.durationSeconds).toBe(1920);
  });

  it.each([
    // Design palette; choice follows WCAG 2.2 contrast: ink text on light fills, white on dark.
    ['#F2A541', '0x172033'], // sun
    ['#C9C2B6', '0x172033'], // stone
    ['#172033', '0xFFFFFF'], // ink
    ['#6C5B7B', '0xFFFFFF'], // dusk
  ])('text colour on %s is %s', (bg, fg) => {
    expect(textColorFor(bg)).toBe(fg);
  });

  it('refuses colours that are not #RRGGBB', () => {
    expect(() => buildDemoVideoArgs({ spans: [{ label: 'x', seconds: 1, color: 'red' }], output: 'o.mp4', workDir: '/w' })).toThrow(
      /#RRGGBB/,
    );
  });
});

describe('ffmpeg -progress parsing', () => {
  // Block copied from a real ffmpeg 5.1 run (see tests/integration/media-pipeline.test.ts).
  const block = (us: string, progress: string) =>
    `frame=180\nfps=308.59\nbitrate=N/A\ntotal_size=N/A\nout_time_us=${us}\nout_time_ms=${us}\nout_time=00:00:06.000000\ndup_frames=0\ndrop_frames=0\nspeed=10.3x\nprogress=${progress}\n`;

  it('reports percent of the duration per block, however stdout is chunked', () => {
    const parse = createProgressParser(12);
    const text = block('3000000', 'continue') + block('6000000', 'continue') + block('12010667', 'end');
    const reports = [text.slice(0, 37), text.slice(37, 200), text.slice(200)].flatMap((chunk) => parse(chunk));
    expect(reports).toEqual([
      { percent: 25, outTimeSeconds: 3, speed: 10.3, done: false },
      { percent: 50, outTimeSeconds: 6, speed: 10.3, done: false },
      { percent: 100, outTimeSeconds: 12.010667, speed: 10.3, done: true },
    ]);
  });

  it('caps at 99.9 % until ffmpeg says progress=end, and reads out_time when out_time_us is N/A', () => {
    const parse = createProgressParser(10);
    expect(parse('out_time_us=N/A\nout_time=00:00:10.500000\nprogress=continue\n')).toEqual([
      { percent: 99.9, outTimeSeconds: 10.5, done: false },
    ]);
    expect(parseClock('01:02:03.5')).toBe(3723.5);
    expect(parseClock('N/A')).toBeUndefined();
  });
});
