import { describe, expect, it } from 'vitest';
import {
  parseFfprobeJson,
  probeVerdict,
  REASONS,
  sniffContainer,
  WARNINGS,
  type UnreadableProbe,
} from '~/lib/media/probe-verdict';

// Trimmed copies of real `ffprobe -v error -print_format json -show_format -show_streams` output
// (ffprobe 5.1 on clips made with ffmpeg's testsrc/aevalsrc/sine sources); fields we ignore removed.
const h264 = (over: Record<string, unknown> = {}) => ({
  index: 0, codec_name: 'h264', codec_type: 'video', width: 640, height: 360,
  r_frame_rate: '30/1', avg_frame_rate: '30/1', duration: '12.000000', bit_rate: '171438', nb_frames: '360',
  disposition: { default: 1, attached_pic: 0 }, ...over,
});
const aac = (over: Record<string, unknown> = {}) => ({
  index: 1, codec_name: 'aac', codec_type: 'audio', sample_rate: '48000', channels: 1,
  r_frame_rate: '0/0', avg_frame_rate: '0/0', duration: '12.000000', bit_rate: '6933', nb_frames: '564',
  disposition: { default: 1, attached_pic: 0 }, ...over,
});
const mp4 = (streams: unknown[], format: Record<string, unknown> = {}) => ({
  streams,
  format: { filename: 'a.mp4', nb_streams: streams.length, format_name: 'mov,mp4,m4a,3gp,3g2,mj2', duration: '12.000000', size: '279354', ...format },
});

describe('probeVerdict on parsed ffprobe JSON', () => {
  it.each([
    ['a 12 s MP4 with video and sound', mp4([h264(), aac()]), { ok: true, warnings: [] }],
    ['a video-only MP4', mp4([h264()], { size: '257157' }), { ok: true, warnings: [WARNINGS.noAudio] }],
    ['an audio-only M4A', mp4([aac()], { size: '11000' }), { ok: false, reason: REASONS.noVideo }],
    [
      'an audio file whose only "video" is cover art',
      mp4([aac(), h264({ index: 1, codec_name: 'mjpeg', nb_frames: '1', bit_rate: '100', disposition: { attached_pic: 1 } })]),
      { ok: false, reason: REASONS.noVideo },
    ],
    ['a 4 s clip', mp4([h264({ duration: '4.000000' })], { duration: '4.000000', size: '90000' }), { ok: false, reason: REASONS.tooShort(4, 10) }],
    ['a file with no duration anywhere', mp4([h264({ duration: 'N/A' })], { duration: 'N/A' }), { ok: false, reason: REASONS.truncated }],
    ['a video track with no frames', mp4([h264({ nb_frames: '0', bit_rate: '0' })]), { ok: false, reason: REASONS.truncated }],
    // faststart MP4 cut in half: the index promises 12 s of 178 kbit/s but only 139677 bytes remain.
    ['a faststart MP4 cut in half', mp4([h264(), aac()], { size: '139677' }), { ok: false, reason: REASONS.truncated }],
    [
      'a WebM (Matroska index has no frame counts or bit rates)',
      {
        streams: [
          { index: 0, codec_name: 'vp9', codec_type: 'video', width: 1280, height: 720, r_frame_rate: '30/1', avg_frame_rate: '30/1', disposition: { attached_pic: 0 } },
          { index: 1, codec_name: 'opus', codec_type: 'audio', channels: 2, r_frame_rate: '0/0', avg_frame_rate: '0/0', disposition: { attached_pic: 0 } },
        ],
        format: { format_name: 'matroska,webm', duration: '30.000000', size: '500000' },
      },
      { ok: true, warnings: [] },
    ],
    ['an AVI', mp4([h264(), aac()], { format_name: 'avi' }), { ok: false, reason: REASONS.container('avi') }],
    ['an ANSI text file probed as tty', { streams: [{ codec_name: 'ansi', codec_type: 'video', width: 640, height: 400 }], format: { format_name: 'tty', duration: '0.04' } }, { ok: false, reason: REASONS.container('tty') }],
  ])('%s', (_name, json, expected) => {
    const verdict = probeVerdict(parseFfprobeJson(json));
    expect(verdict).toMatchObject(expected);
  });

  it('warns when the sound track is silent (peak at or below -60 dBFS)', () => {
    const summary = parseFfprobeJson(mp4([h264(), aac()]));
    expect(probeVerdict(summary, { audioPeakDb: -75 })).toMatchObject({ ok: true, warnings: [WARNINGS.silentAudio] });
    expect(probeVerdict(summary, { audioPeakDb: -Infinity })).toMatchObject({ ok: true, warnings: [WARNINGS.silentAudio] });
    expect(probeVerdict(summary, { audioPeakDb: -20 })).toMatchObject({ ok: true, warnings: [] });
  });

  it('returns the facts packaging needs', () => {
    expect(probeVerdict(parseFfprobeJson(mp4([h264(), aac()])))).toEqual({
      ok: true,
      warnings: [],
      summary: { durationSeconds: 12, width: 640, height: 360, frameRate: 30, hasAudio: true, videoCodec: 'h264', audioCodec: 'aac' },
    });
  });

  it.each([
    ['empty', { sizeBytes: 0, header: 'empty' }, REASONS.empty],
    ['an MP4 that lost its index ("moov atom not found")', { sizeBytes: 139677, header: 'mp4' }, REASONS.truncated],
    ['a cut-off MKV', { sizeBytes: 5000, header: 'matroska' }, REASONS.truncated],
    ['a text file renamed .mp4', { sizeBytes: 12, header: 'unknown' }, REASONS.notVideo],
  ] as const)('ffprobe refused %s', (_name, probe, reason) => {
    const unreadable: UnreadableProbe = { unreadable: true, message: 'Invalid data found when processing input', ...probe };
    expect(probeVerdict(unreadable)).toEqual({ ok: false, reason });
  });
});

describe('parseFfprobeJson', () => {
  it('reads text JSON, NTSC rates and missing values', () => {
    const summary = parseFfprobeJson(
      JSON.stringify({
        streams: [{ codec_type: 'video', codec_name: 'h264', width: 1920, height: 1080, avg_frame_rate: '30000/1001', nb_frames: 'N/A' }],
        format: { format_name: 'mov,mp4,m4a,3gp,3g2,mj2', duration: '61.5' },
      }),
    );
    expect(summary).toEqual({
      durationSeconds: 61.5,
      formatName: 'mov,mp4,m4a,3gp,3g2,mj2',
      streams: [{ type: 'video', codec: 'h264', width: 1920, height: 1080, frameRate: 30000 / 1001 }],
    });
  });

  it('falls back to r_frame_rate when avg_frame_rate is 0/0, and to stream durations', () => {
    const summary = parseFfprobeJson({
      streams: [{ codec_type: 'video', codec_name: 'vp8', width: 320, height: 240, avg_frame_rate: '0/0', r_frame_rate: '25/1', duration: '14.2' }],
      format: { format_name: 'matroska,webm' },
    });
    expect(summary.durationSeconds).toBe(14.2);
    expect(summary.streams[0]?.frameRate).toBe(25);
  });

  it.each([
    ['side data rotation -90', { side_data_list: [{ side_data_type: 'Display Matrix', rotation: -90 }] }, [1080, 1920]],
    ['rotate tag 270', { tags: { rotate: '270' } }, [1080, 1920]],
    ['rotation 180', { side_data_list: [{ rotation: 180 }] }, [1920, 1080]],
  ])('swaps width and height for phone video with %s', (_name, extra, [w, h]) => {
    const summary = parseFfprobeJson({ streams: [{ codec_type: 'video', codec_name: 'h264', width: 1920, height: 1080, ...extra }], format: { format_name: 'mov' } });
    expect(summary.streams[0]).toMatchObject({ width: w, height: h });
  });

  it('gives an empty summary for an empty object rather than guessing', () => {
    expect(parseFfprobeJson({})).toEqual({ durationSeconds: null, formatName: '', streams: [] });
  });
});

describe('sniffContainer', () => {
  const bytes = (...b: number[]) => Uint8Array.from(b);
  const ascii = (s: string) => Uint8Array.from(s, (c) => c.charCodeAt(0));
  it.each([
    ['MP4 ftyp box', bytes(0, 0, 0, 0x20, ...ascii('ftypisom')), 'mp4'],
    ['old QuickTime wide box', bytes(0, 0, 0, 8, ...ascii('wide')), 'mp4'],
    ['EBML magic (MKV/WebM, RFC 8794)', bytes(0x1a, 0x45, 0xdf, 0xa3, 0x9f), 'matroska'],
    ['plain text', ascii('hello world\n'), 'unknown'],
    ['nothing', bytes(), 'empty'],
  ] as const)('%s → %s', (_name, head, expected) => {
    expect(sniffContainer(head)).toBe(expected);
  });
});
