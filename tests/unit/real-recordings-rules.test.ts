/**
 * The pure decisions behind issue 16: the verdict with a measured length, photo and sound-only
 * messages, the HDR tone map in every picture-making argument list, the packet measurement
 * arguments, and loudness (ITU-R BS.1770-4 / EBU R 128 as ffmpeg's ebur128 prints it).
 */
import { describe, expect, it } from 'vitest';
import { buildPackageArgs, buildPosterArgs } from '~/lib/media/hls-ladder';
import { buildChapterThumbnailArgs } from '~/lib/media/chapter-thumbnail-args';
import { buildMeasureArgs, packetLength } from '~/lib/media/media-length';
import { displayGainDb, isTooQuiet, parseIntegratedLoudness, QUIET_LUFS, scalePeaks } from '~/lib/media/loudness';
import { needsMeasuring, probeVerdict, REASONS, WARNINGS, type ProbeSummary } from '~/lib/media/probe-verdict';
import { isHdrTransfer, sdrToneMapFilter } from '~/lib/media/tone-map';
import { createRecordingInput } from '~/lib/api/recording-schemas';

const TONE_MAP = 'zscale=t=linear:npl=203,format=gbrpf32le,zscale=p=bt709,tonemap=tonemap=mobius:desat=0,zscale=t=bt709:m=bt709:r=tv,format=yuv420p';

const probe = (over: Partial<ProbeSummary> = {}): ProbeSummary => ({
  durationSeconds: 30,
  formatName: 'mov,mp4,m4a,3gp,3g2,mj2',
  streams: [
    { type: 'video', codec: 'h264', width: 640, height: 360, frameRate: 30 },
    { type: 'audio', codec: 'aac', channels: 2 },
  ],
  ...over,
});

describe('the verdict with the length the packets cover', () => {
  it('accepts a WebM without a container duration at its measured length, without a warning', () => {
    const webm = probe({ durationSeconds: null, formatName: 'matroska,webm' });
    expect(probeVerdict(webm)).toEqual({ ok: false, reason: REASONS.truncated }); // unmeasured: nothing to go on
    const v = probeVerdict(webm, { measuredSeconds: 12.0 });
    expect(v).toMatchObject({ ok: true, warnings: [], summary: { durationSeconds: 12, containerSeconds: null } });
  });

  it.each([
    [29.5, true, 30], // within a second: the container's exact figure, no warning
    [28.47, true, 28.47], // issue 16's cut file: warn, use the packets
    [27.1, true, 27.1], // 90.3 % still a warning
    [26.9, false, null], // under 90 %: the packets really stop early
    [null, false, null], // no packet at all
  ])('packets to %s s of a 30 s claim: accepted %s, length %s', (measured, ok, length) => {
    const v = probeVerdict(probe(), { measuredSeconds: measured });
    expect(v.ok).toBe(ok);
    if (v.ok) {
      expect(v.summary.durationSeconds).toBe(length);
      const cut = measured !== null && 30 - measured > 1;
      expect(v.warnings).toEqual(cut ? [WARNINGS.cutShort(measured, 30)] : []);
      expect(v.summary.containerSeconds).toBe(cut ? 30 : undefined);
    } else expect(v.reason).toBe(REASONS.truncated);
  });

  it('names both lengths in the cut-file warning, as a coach reads them', () => {
    expect(WARNINGS.cutShort(28.47, 30)).toBe(
      'The file says it is 0:30.0 long, but its picture stops at 0:28.5: the end is missing (the copy or export was cut off). ' +
        'The class uses the 0:28.5 that are there; upload a complete copy if the end matters.',
    );
  });

  it('tells a photo renamed .mp4 that it is a photo, never ffmpeg’s format name', () => {
    const photo = probe({ formatName: 'jpeg_pipe', durationSeconds: null, streams: [{ type: 'video', codec: 'mjpeg', width: 640, height: 360 }] });
    expect(needsMeasuring(photo)).toBe(false);
    expect(probeVerdict(photo)).toEqual({ ok: false, reason: REASONS.photo('JPEG') });
    expect(REASONS.photo('JPEG')).toBe('This file is a photo (JPEG), not a video. Upload the video recording of the class as MP4, MOV, WebM or MKV.');
    expect(probeVerdict(probe({ formatName: 'png_pipe' }))).toEqual({ ok: false, reason: REASONS.photo('PNG') });
  });

  it('tells a sound-only file it has no picture', () => {
    const m4a = probe({ streams: [{ type: 'audio', codec: 'aac' }] });
    expect(needsMeasuring(m4a)).toBe(false);
    expect(probeVerdict(m4a)).toEqual({ ok: false, reason: REASONS.noVideo });
    expect(REASONS.noVideo).toMatch(/no picture/);
  });

  it('carries the transfer characteristics through', () => {
    const hlg = probe({ streams: [{ type: 'video', codec: 'hevc', width: 640, height: 360, colorTransfer: 'arib-std-b67' }] });
    const v = probeVerdict(hlg, { measuredSeconds: 30 });
    expect(v.ok && v.summary.colorTransfer).toBe('arib-std-b67');
  });
});

describe('announcing a sound file', () => {
  it.each(['class.m4a', 'class.MP3', 'class.wav'])('%s is told it has no picture', (fileName) => {
    const r = createRecordingInput.safeParse({ fileName, sizeBytes: 1000, contentType: '' });
    expect(r.success).toBe(false);
    if (!r.success) expect(r.error.issues[0]!.message).toBe(`"${fileName}" is a sound file: it has no picture. Upload the video recording of the class (MP4, MOV, WebM or MKV).`);
  });
});

describe('measuring the packets', () => {
  it('copies the first video stream to nowhere, reporting progress', () => {
    expect(buildMeasureArgs('in.webm')).toEqual([
      '-hide_banner', '-nostdin', '-loglevel', 'error', '-nostats', '-progress', 'pipe:1',
      '-i', 'in.webm', '-map', '0:v:0', '-c', 'copy', '-f', 'null', '-',
    ]);
  });

  it.each([
    [11.966667, 30, 12],
    [599.982, 30, 600.015],
    [5, undefined, 5],
    [0, 30, null],
    [null, 30, null],
  ])('last packet at %s s, %s fps: %s s', (last, fps, expected) => {
    expect(packetLength(last, fps)).toBe(expected);
  });
});

describe('HDR to SDR', () => {
  it.each([
    ['arib-std-b67', true], // HLG, ITU-T H.273 transfer 18
    ['smpte2084', true], // PQ, ITU-T H.273 transfer 16
    ['bt709', false],
    [undefined, false],
  ])('%s is HDR: %s', (transfer, hdr) => {
    expect(isHdrTransfer(transfer)).toBe(hdr);
    expect(sdrToneMapFilter(transfer)).toBe(hdr ? TONE_MAP : null);
  });

  it('tone-maps before the split and tags the ladder BT.709', () => {
    const args = buildPackageArgs({ input: 'in', outputDir: 'o', probe: { width: 640, height: 360, frameRate: 30, hasAudio: false, colorTransfer: 'arib-std-b67' } });
    expect(args[args.indexOf('-filter_complex') + 1]).toBe(`[0:v:0]${TONE_MAP},fps=30,format=yuv420p,split=2[s0][s1];[s0]scale=640:360[v0];[s1]scale=426:240[v1]`);
    const tags = args.indexOf('-color_primaries');
    expect(args.slice(tags, tags + 6)).toEqual(['-color_primaries', 'bt709', '-color_trc', 'bt709', '-colorspace', 'bt709']);
    const sdr = buildPackageArgs({ input: 'in', outputDir: 'o', probe: { width: 640, height: 360, frameRate: 30, hasAudio: false, colorTransfer: 'bt709' } });
    expect(sdr).not.toContain('-color_primaries');
  });

  it('makes the poster and chapter thumbnails from the mapped picture', () => {
    const poster = buildPosterArgs({ input: 'in', output: 'p.jpg', probe: { width: 640, height: 360, durationSeconds: 30, colorTransfer: 'smpte2084' } });
    expect(poster[poster.indexOf('-vf') + 1]).toBe(`${TONE_MAP},scale=640:360`);
    const thumb = buildChapterThumbnailArgs({ input: 'in', output: 't.jpg', chapter: { startSeconds: 0, endSeconds: 10 }, colorTransfer: 'arib-std-b67' });
    expect(thumb[thumb.indexOf('-vf') + 1]).toBe(`${TONE_MAP},scale=-2:180`);
  });
});

describe('loudness (ITU-R BS.1770-4 / EBU R 128, as ffmpeg 5.1 ebur128 prints it)', () => {
  const summary = (i: string) =>
    `[Parsed_ebur128_0 @ 0x1] Summary:\n\n  Integrated loudness:\n    I:         ${i} LUFS\n    Threshold: -64.3 LUFS\n\n  Loudness range:\n    LRA:         0.0 LU\n`;

  it.each([
    [summary('-54.3'), -54.3],
    [summary('-3.0'), -3], // a full-scale 1 kHz sine reads -3.0 LUFS (checked here with ebur128 on ffmpeg 5.1)
    [summary('-70.0'), null], // every block under the absolute gate (-70 LUFS)
    [summary('-inf'), null],
    ['no summary at all', null],
  ])('reads %j as %s', (text, lufs) => {
    expect(parseIntegratedLoudness(text)).toBe(lufs);
  });

  it.each([
    [-54.3, 31.3],
    [-23, 0], // at EBU R 128's target: untouched
    [-10, 0], // louder: never cut
    [-80, 40], // capped
    [null, 0],
  ])('lifts the waveform of a %s LUFS recording by %s dB', (lufs, gain) => {
    expect(displayGainDb(lufs)).toBeCloseTo(gain, 6);
  });

  it('scales peaks by the gain and clips at full scale', () => {
    const scaled = scalePeaks({ rate: 100, min: Float32Array.from([-0.005, -0.5]), max: Float32Array.from([0.005, 0.5]) }, 20);
    expect(scaled.max[0]).toBeCloseTo(0.05, 6);
    expect(scaled.min[0]).toBeCloseTo(-0.05, 6);
    expect([scaled.min[1], scaled.max[1]]).toEqual([-1, 1]);
  });

  it(`warns below ${QUIET_LUFS} LUFS`, () => {
    expect(isTooQuiet(-35.1)).toBe(true);
    expect(isTooQuiet(-35)).toBe(false);
    expect(isTooQuiet(null)).toBe(false); // silence has its own warning
  });
});
