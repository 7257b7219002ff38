/**
 * HLS playlists name their media by URI lines (RFC 8216 section 4.1: every line that is not blank
 * and does not start with `#` is a URI) and by `URI="…"` attributes (EXT-X-MAP, EXT-X-KEY,
 * EXT-X-MEDIA). These helpers list and replace them, so the app can hand members playlists whose
 * media links point straight at storage.
 */
const URI_ATTRIBUTE = /URI="([^"]*)"/g;

/** Every URI a playlist references, in order of appearance (duplicates kept once). */
export function playlistUris(text: string): string[] {
  const seen = new Set<string>();
  for (const raw of text.split(/\r?\n/)) {
    const line = raw.trim();
    if (!line) continue;
    if (line.startsWith('#')) {
      for (const m of line.matchAll(URI_ATTRIBUTE)) seen.add(m[1]!);
    } else {
      seen.add(line);
    }
  }
  return [...seen];
}

/** The playlist with each URI replaced by `links.get(uri)`; URIs without a replacement stay. */
export function rewritePlaylist(text: string, links: ReadonlyMap<string, string>): string {
  return text
    .split(/\r?\n/)
    .map((raw) => {
      const line = raw.trim();
      if (!line) return raw;
      if (line.startsWith('#')) return raw.replace(URI_ATTRIBUTE, (m, uri: string) => (links.has(uri) ? `URI="${links.get(uri)}"` : m));
      return links.get(line) ?? raw;
    })
    .join('\n');
}

/** A media playlist (segments) as opposed to a master playlist (variants), per RFC 8216 section 4.3.3 / 4.3.4. */
export function isMasterPlaylist(text: string): boolean {
  return /^#EXT-X-STREAM-INF:/m.test(text);
}
