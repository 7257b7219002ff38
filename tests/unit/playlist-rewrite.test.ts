import { describe, expect, it } from 'vitest';
import { isMasterPlaylist, playlistUris, rewritePlaylist } from '~/lib/media/playlist-rewrite';
import HLS from 'hls-parser';

// A media playlist in the shape our packaging writes (RFC 8216 section 8.1's example, extended
// with an EXT-X-MAP tag so URI attributes are covered too); invented for this test.
const MEDIA = `#EXTM3U
#EXT-X-VERSION:6
#EXT-X-TARGETDURATION:4
#EXT-X-PLAYLIST-TYPE:VOD
#EXT-X-MAP:URI="init.mp4"
#EXTINF:4.000000,
seg_000.ts
#EXTINF:4.000000,
seg_001.ts
#EXTINF:1.500000,
seg_002.ts
#EXT-X-ENDLIST
`;

const MASTER = `#EXTM3U
#EXT-X-VERSION:6
#EXT-X-STREAM-INF:BANDWIDTH=1400000,RESOLUTION=1280x720,CODECS="avc1.64001f,mp4a.40.2"
v0/index.m3u8
`;

describe('HLS playlist rewriting', () => {
  it('lists URI lines and URI attributes once each, in order', () => {
    expect(playlistUris(MEDIA)).toEqual(['init.mp4', 'seg_000.ts', 'seg_001.ts', 'seg_002.ts']);
    expect(playlistUris(MASTER)).toEqual(['v0/index.m3u8']);
  });

  it('replaces every segment and keeps the playlist valid for a strict reader', () => {
    const links = new Map(playlistUris(MEDIA).map((u) => [u, `https://store.example/b/${u}?X-Amz-Signature=abc&X-Amz-Expires=3600`]));
    const out = rewritePlaylist(MEDIA, links);
    // hls-parser (npm) in strict mode as the independent reader of RFC 8216.
    HLS.setOptions({ strictMode: true });
    const parsed = HLS.parse(out) as InstanceType<typeof HLS.types.MediaPlaylist>;
    expect(parsed.segments.map((s) => s.uri)).toEqual([1, 2, 3].map((i) => `https://store.example/b/seg_00${i - 1}.ts?X-Amz-Signature=abc&X-Amz-Expires=3600`));
    expect(parsed.segments.map((s) => s.duration)).toEqual([4, 4, 1.5]);
    expect(out).toContain('#EXT-X-MAP:URI="https://store.example/b/init.mp4?');
    expect(out).not.toMatch(/^seg_/m);
  });

  it('leaves URIs without a replacement as they were', () => {
    expect(rewritePlaylist(MEDIA, new Map([['seg_001.ts', 'X']]))).toBe(MEDIA.replace('\nseg_001.ts\n', '\nX\n'));
  });

  it('tells a master playlist from a media playlist', () => {
    expect(isMasterPlaylist(MASTER)).toBe(true);
    expect(isMasterPlaylist(MEDIA)).toBe(false);
  });
});
