/**
 * The media core against the real Debian ffmpeg/ffprobe 5.1, on media generated here.
 * Outside references: RFC 8216 (HLS) sections beside each playlist check; hls-parser 0.16 in
 * strict mode as an independent reader; tolerances from shared/check-values.md (one frame at
 * 30 fps = 33.4 ms for durations) and issue 5 (50 ms for onsets).
 */
import { execFile } from 'node:child_process';
import { mkdtemp, readFile, rm, stat, writeFile, readdir } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import HLS from 'hls-parser';
import { buildPackageArgs, buildPosterArgs, chooseLadder } from '~/lib/media/hls-ladder';
import { decodePeaks } from '~/lib/media/peaks';
import { findOnsets } from '~/lib/media/onsets';
import { probeVerdict, REASONS, WARNINGS, type ProbeSummary } from '~/lib/media/probe-verdict';
import { buildDemoVideoArgs, drawtextFilter, DEMO_FONT_FILE } from '~/scripts/demo/demo-video-args';
import type { FfmpegProgress } from '~/lib/media/progress';
import { computeFilePeaks, probeFile, readPeaks, runFfmpeg, runFfmpegCommand } from '~/server/media/ffmpeg-runner';

const run = promisify(execFile);
const ONE_FRAME = 0.0334; // check-values.md: one frame at 30 fps
const ONSET_TOLERANCE = 0.05; // issue 5
const TONES = [1.0, 3.5, 6.25, 9.0, 10.4]; // seconds; irregular on purpose

let dir: string;
const path = (name: string) => join(dir, name);

/** The test's own ffmpeg calls, independent of the code under test. */
async function ffmpeg(...args: string[]) {
  await run('ffmpeg', ['-hide_banner', '-loglevel', 'error', '-y', ...args]);
}

function toneExpression(times: number[]): string {
  // Commas inside a filter argument are escaped for the filtergraph parser.
  const gates = times.map((t) => `between(t\\,${t}\\,${(t + 0.15).toFixed(3)})`).join('+');
  return `0.5*sin(2*PI*1000*t)*(${gates})`;
}

function expectProbed(probe: ProbeSummary | { unreadable: true }): ProbeSummary {
  if ('unreadable' in probe) throw new Error('expected a readable file');
  return probe;
}

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'roundmark-media-'));
  const video = ['-f', 'lavfi', '-i', 'testsrc=duration=12:size=640x360:rate=30'];
  const x264 = ['-c:v', 'libx264', '-preset', 'ultrafast', '-pix_fmt', 'yuv420p'];
  // 12 s, 640x360, 30 fps, with 1 kHz tones at TONES (aevalsrc: gated to the sample, check-values.md).
  await ffmpeg(...video, '-f', 'lavfi', '-i', `aevalsrc=${toneExpression(TONES)}:s=48000:d=12`, ...x264, '-c:a', 'aac', path('av.mp4'));
  await ffmpeg(...video, ...x264, path('video-only.mp4'));
  await ffmpeg('-f', 'lavfi', '-i', 'sine=frequency=440:duration=12', '-c:a', 'aac', path('audio-only.m4a'));
  await ffmpeg('-f', 'lavfi', '-i', 'testsrc=duration=5:size=320x180:rate=30', ...x264, path('short.mp4'));
  await writeFile(path('notes.mp4'), 'Warm-up 4 min, then 5 stations x 40 s.\n');
  await writeFile(path('empty.mp4'), '');
  const whole = await readFile(path('av.mp4'));
  await writeFile(path('truncated.mp4'), whole.subarray(0, Math.floor(whole.length / 2)));
  // The same clip with its index at the front (faststart), then cut in half.
  await ffmpeg('-i', path('av.mp4'), '-c', 'copy', '-movflags', '+faststart', path('faststart.mp4'));
  const fast = await readFile(path('faststart.mp4'));
  await writeFile(path('faststart-truncated.mp4'), fast.subarray(0, Math.floor(fast.length / 2)));
});

afterAll(async () => {
  if (dir) await rm(dir, { recursive: true, force: true });
});

describe('probe', () => {
  it.each(['av.mp4', 'video-only.mp4'])('%s: 12 s at 30 fps probes to within one frame', async (name) => {
    const probe = expectProbed(await probeFile(path(name)));
    expect(Math.abs((probe.durationSeconds ?? 0) - 12)).toBeLessThanOrEqual(ONE_FRAME);
    const verdict = probeVerdict(probe);
    expect(verdict.ok).toBe(true);
    if (verdict.ok) {
      expect(verdict.summary).toMatchObject({ width: 640, height: 360, frameRate: 30 });
      expect(verdict.warnings).toEqual(name === 'video-only.mp4' ? [WARNINGS.noAudio] : []);
    }
  });

  it.each([
    ['notes.mp4', 'a text file renamed .mp4', REASONS.notVideo],
    ['truncated.mp4', 'an MP4 cut in half', REASONS.truncated],
    ['faststart-truncated.mp4', 'a faststart MP4 cut in half', REASONS.truncated],
    ['empty.mp4', 'a zero-byte file', REASONS.empty],
    ['audio-only.m4a', 'an audio-only file', REASONS.noVideo],
    ['short.mp4', 'a 5 s clip', REASONS.tooShort(5, 10)],
  ])('%s (%s) is refused with its reason', async (name, _what, reason) => {
    expect(probeVerdict(await probeFile(path(name)))).toEqual({ ok: false, reason });
  });
});

describe('HLS packaging', () => {
  async function packageClip(name: string, outName: string) {
    const probe = expectProbed(await probeFile(path(name)));
    const verdict = probeVerdict(probe);
    if (!verdict.ok) throw new Error(verdict.reason);
    const outputDir = path(outName);
    const args = buildPackageArgs({ input: path(name), outputDir, probe: verdict.summary, preset: 'ultrafast' });
    const reports: FfmpegProgress[] = [];
    await runFfmpeg(args, { durationSeconds: verdict.summary.durationSeconds, onProgress: (p) => reports.push(p) });
    const master = HLS.parse(await readFile(join(outputDir, 'master.m3u8'), 'utf8'));
    return { outputDir, master, reports, facts: verdict.summary };
  }

  beforeAll(() => {
    HLS.setOptions({ strictMode: true });
  });

  it('writes a VOD ladder that follows RFC 8216, with progress up to 100 %', async () => {
    const { outputDir, master, reports, facts } = await packageClip('av.mp4', 'hls-av');
    expect(master.isMasterPlaylist).toBe(true);
    if (!master.isMasterPlaylist) return;
    const ladder = chooseLadder(facts);
    expect(master.variants).toHaveLength(ladder.length);

    const extinfLists: number[][] = [];
    for (const [i, variant] of master.variants.entries()) {
      // RFC 8216 §4.3.4.2: EXT-X-STREAM-INF must carry BANDWIDTH; CODECS should; RESOLUTION recommended for video.
      expect(variant.bandwidth).toBeGreaterThan(0);
      expect(variant.codecs).toMatch(/^avc1\.[0-9a-f]{6},mp4a\.40\.2$/);
      expect(variant.resolution).toEqual({ width: ladder[i]!.width, height: ladder[i]!.height });

      const text = await readFile(join(outputDir, variant.uri), 'utf8');
      const media = HLS.parse(text); // strict mode throws on RFC violations it knows
      expect(media.isMasterPlaylist).toBe(false);
      if (media.isMasterPlaylist) return;
      // RFC 8216 §4.3.3.1: every EXTINF rounded to the nearest integer is ≤ EXT-X-TARGETDURATION.
      for (const segment of media.segments) expect(Math.round(segment.duration)).toBeLessThanOrEqual(media.targetDuration);
      // RFC 8216 §4.3.3.4 and §4.3.3.5: VOD playlists end with EXT-X-ENDLIST and say PLAYLIST-TYPE:VOD.
      expect(media.endlist).toBe(true);
      expect(media.playlistType).toBe('VOD');
      // RFC 8216 §7 / §4.3.1.2: decimal EXTINF values need EXT-X-VERSION ≥ 3, given once.
      expect(media.version).toBeGreaterThanOrEqual(3);
      expect(text.match(/#EXT-X-VERSION/g)).toHaveLength(1);
      // Issue 4: segments 4–6 s; 12 s at 4 s per segment with a keyframe every 120 frames = 3 × 4 s.
      expect(media.segments.map((s) => s.duration)).toEqual([4, 4, 4]);
      extinfLists.push(media.segments.map((s) => s.duration));
      for (const segment of media.segments) await stat(join(outputDir, `v${i}`, segment.uri));
    }
    // Keyframes aligned across renditions: identical segment boundaries everywhere.
    for (const list of extinfLists) expect(list).toEqual(extinfLists[0]);

    // Each segment of the lowest rendition starts on a keyframe (ffprobe reads the first frame).
    const lowest = join(outputDir, `v${master.variants.length - 1}`);
    for (const file of (await readdir(lowest)).filter((f) => f.endsWith('.ts'))) {
      const { stdout } = await run('ffprobe', ['-v', 'error', '-select_streams', 'v:0', '-read_intervals', '%+#1', '-show_entries', 'frame=key_frame', '-of', 'default=noprint_wrappers=1:nokey=1', join(lowest, file)]);
      expect(stdout.trim().split('\n')[0]).toBe('1');
    }

    expect(reports.length).toBeGreaterThan(0);
    expect(reports.at(-1)).toMatchObject({ percent: 100, done: true });
    for (let i = 1; i < reports.length; i++) expect(reports[i]!.percent).toBeGreaterThanOrEqual(reports[i - 1]!.percent);
  });

  it('packages a recording without sound (video-only variants)', async () => {
    const { master } = await packageClip('video-only.mp4', 'hls-video-only');
    if (!master.isMasterPlaylist) throw new Error('expected a master playlist');
    expect(master.variants.length).toBeGreaterThan(0);
    for (const variant of master.variants) {
      expect(variant.bandwidth).toBeGreaterThan(0); // RFC 8216 §4.3.4.2
      expect(variant.codecs).toMatch(/^avc1\.[0-9a-f]{6}$/); // no audio codec listed
    }
  });

  it('stops ffmpeg when the job is aborted, and rejects', async () => {
    const controller = new AbortController();
    const args = buildPackageArgs({ input: path('av.mp4'), outputDir: path('hls-aborted'), probe: { width: 640, height: 360, frameRate: 30, hasAudio: true }, preset: 'ultrafast' });
    const started = Date.now();
    const running = runFfmpeg(args, { durationSeconds: 12, signal: controller.signal, onProgress: () => controller.abort() });
    await expect(running).rejects.toThrow(/abort/i);
    expect(Date.now() - started).toBeLessThan(5000);
  });

  it('takes a poster JPEG at 10 % of the duration', async () => {
    const facts = { width: 640, height: 360, durationSeconds: 12 };
    await runFfmpeg(buildPosterArgs({ input: path('av.mp4'), output: path('poster.jpg'), probe: facts }));
    const { stdout } = await run('ffprobe', ['-v', 'error', '-show_entries', 'stream=codec_name,width,height', '-of', 'csv=p=0', path('poster.jpg')]);
    expect(stdout.trim()).toBe('mjpeg,640,360');
  });
});

describe('peaks and onsets', () => {
  it('gives duration × 100 peaks (±1) and finds each generated tone within 50 ms', async () => {
    const probe = expectProbed(await probeFile(path('av.mp4')));
    const encoded = await readPeaks(path('av.mp4'), 100, { durationSeconds: probe.durationSeconds ?? 0 });
    const peaks = decodePeaks(encoded);
    expect(peaks.rate).toBe(100);
    expect(Math.abs(peaks.min.length - 12 * 100)).toBeLessThanOrEqual(1);
    const onsets = findOnsets(peaks);
    expect(onsets).toHaveLength(TONES.length);
    TONES.forEach((t, i) => expect(Math.abs(onsets[i]! - t)).toBeLessThanOrEqual(ONSET_TOLERANCE));
  });

  it('rejects peaks for a file without sound', async () => {
    await expect(computeFilePeaks(path('video-only.mp4'))).rejects.toThrow(/matches no streams|does not contain any stream/);
  });
});

describe('demo video', () => {
  const spans = [
    { label: 'WARM-UP  Easy march', seconds: 4, color: '#F2A541' },
    { label: 'WORK  Goblet squat  round 2/4', seconds: 3.5, color: '#E4572E' },
    { label: 'REST', seconds: 2, color: '#2E86AB' },
    { label: "WORK  Push-up  round 2/4 — it's 100%: go!", seconds: 3, color: '#E4572E' },
    { label: 'COOL-DOWN', seconds: 2.5, color: '#6C5B7B' },
  ];

  it('lasts the sum of its spans (within one frame) and has a tone at each span start (within 50 ms)', async () => {
    const cmd = buildDemoVideoArgs({ spans, output: path('demo.mp4'), workDir: dir });
    const reports: FfmpegProgress[] = [];
    await runFfmpegCommand(cmd, { durationSeconds: cmd.durationSeconds, onProgress: (p) => reports.push(p) });
    const probe = expectProbed(await probeFile(path('demo.mp4')));
    const expected = spans.reduce((sum, s) => sum + s.seconds, 0); // 15 s, from the table above
    expect(expected).toBe(15);
    expect(Math.abs((probe.durationSeconds ?? 0) - expected)).toBeLessThanOrEqual(ONE_FRAME);
    expect(probe.streams.find((s) => s.type === 'video')).toMatchObject({ width: 854, height: 480, frameRate: 30 });

    const starts = [0, 4, 7.5, 9.5, 12.5]; // cumulative span starts, by hand
    const peaks = await computeFilePeaks(path('demo.mp4'), 100, { durationSeconds: probe.durationSeconds ?? 0 });
    expect(Math.abs(peaks.min.length - expected * 100)).toBeLessThanOrEqual(1);
    const onsets = findOnsets(peaks);
    expect(onsets).toHaveLength(starts.length);
    starts.forEach((t, i) => expect(Math.abs(onsets[i]! - t)).toBeLessThanOrEqual(ONSET_TOLERANCE));
    expect(reports.at(-1)?.done).toBe(true);
  });

  it('draws labels with : \' \\ % , ; [ ] exactly as the same text read from a file (no escaping there)', async () => {
    const tricky = "It's 50% : a\\b [x], y; z";
    const literal = path('label.txt');
    await writeFile(literal, tricky); // textfile content is taken literally with expansion=none
    const base = 'color=c=black:s=320x120:d=0.1';
    const common = `fontfile=${DEMO_FONT_FILE}:expansion=none:fontsize=20:fontcolor=0xFFFFFF:x=(w-text_w)/2:y=(h-text_h)/2`;
    const hash = async (filter: string) => {
      const { stdout } = await run('ffmpeg', ['-v', 'error', '-f', 'lavfi', '-i', filter, '-frames:v', '1', '-f', 'framemd5', '-']);
      return stdout.trim().split('\n').pop();
    };
    const viaFile = await hash(`${base},drawtext=textfile=${literal}:${common}`);
    const viaOurs = await hash(`${base},${drawtextFilter(tricky, { width: 320, height: 120, color: '0xFFFFFF', fontFile: DEMO_FONT_FILE }).replace(/fontsize=\d+/, 'fontsize=20')}`);
    const viaOther = await hash(`${base},${drawtextFilter('something else', { width: 320, height: 120, color: '0xFFFFFF', fontFile: DEMO_FONT_FILE }).replace(/fontsize=\d+/, 'fontsize=20')}`);
    expect(viaOurs).toBe(viaFile);
    expect(viaOther).not.toBe(viaFile); // the comparison can fail
  });
});
