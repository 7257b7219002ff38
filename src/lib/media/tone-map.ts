/**
 * HDR phone video (HLG or PQ, usually 10-bit HEVC) mapped to BT.709 SDR, as ffmpeg filter text.
 * Pure: the packaging, poster and chapter-thumbnail builders put the same chain in front of their
 * own filters, so every picture a member sees comes from the mapped picture.
 */

/** ffprobe's names for HDR transfer characteristics (ITU-T H.273 values 18 = HLG, 16 = PQ). */
export const HDR_TRANSFERS = {
  hlg: 'arib-std-b67',
  pq: 'smpte2084',
} as const;

/** Whether a probed `color_transfer` needs tone-mapping before it can be shown as SDR. */
export function isHdrTransfer(colorTransfer: string | null | undefined): boolean {
  return colorTransfer === HDR_TRANSFERS.hlg || colorTransfer === HDR_TRANSFERS.pq;
}

/**
 * Linear light at 203 cd/m² nominal peak, BT.2020 → BT.709 primaries in float RGB, Möbius
 * tone curve with no desaturation, then BT.709 transfer and matrix in TV range, 8-bit 4:2:0.
 * Debian's ffmpeg 5.1 has zscale and tonemap (libplacebo needs a GPU); checked with
 * `ffmpeg -filters`. The choice of Möbius and 203 was measured on a generated HLG clip: of
 * hable/mobius/clip at 100 and 203, it kept the SDR picture's saturation and came closest to its
 * brightness (mean luma 115 vs 122; hable 79–100). 203 cd/m² as reference white: from memory
 * (ITU-R BT.2408), not checked here.
 */
export function sdrToneMapFilter(colorTransfer: string | null | undefined): string | null {
  if (!isHdrTransfer(colorTransfer)) return null;
  return [
    'zscale=t=linear:npl=203',
    'format=gbrpf32le',
    'zscale=p=bt709',
    'tonemap=tonemap=mobius:desat=0',
    'zscale=t=bt709:m=bt709:r=tv',
    'format=yuv420p',
  ].join(',');
}

/** Output options that tag a tone-mapped encode as BT.709, so players do not treat it as HDR. */
export const BT709_OUTPUT_TAGS: readonly string[] = ['-color_primaries', 'bt709', '-color_trc', 'bt709', '-colorspace', 'bt709'];

/** Prefixes a filter chain with the tone map when the source is HDR. */
export function withToneMap(colorTransfer: string | null | undefined, filters: string): string {
  const map = sdrToneMapFilter(colorTransfer);
  return map ? `${map},${filters}` : filters;
}
