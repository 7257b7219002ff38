import http from 'node:http';

/** Bytes of one page and everything it loads up front, as sent without and with compression. */
export interface PageWeight {
  files: number;
  identityBytes: number;
  compressedBytes: number;
  encoding: string;
  /** Scripts only, as compressed on the wire (what the browser downloads to run the page). */
  scriptCompressedBytes: number;
}

/**
 * Fetches a page and its scripts (static imports, and dynamic ones when asked: the player's
 * hls.js) and stylesheets, each twice: `Accept-Encoding: identity` (no compression, as before the
 * server compressed) and `br, gzip` (what a browser asks for). Counts body bytes as sent, before
 * any decoding, so the figure is what crosses the wire.
 */
export async function pageWeight(base: string, path: string, cookie: string, followDynamic: boolean): Promise<PageWeight> {
  const page = await wire(base + path, cookie, 'identity');
  const html = page.body.toString('utf8');
  const scripts = [...html.matchAll(/(?:src|component-url|renderer-url)="(\/_astro\/[^"]+\.js)"/g)].map((m) => m[1]!);
  const styles = [...html.matchAll(/<link[^>]+href="(\/_astro\/[^"]+\.css)"/g)].map((m) => m[1]!);
  const seen = new Set<string>();
  const queue = [...scripts];
  while (queue.length) {
    const file = queue.shift()!;
    if (seen.has(file)) continue;
    seen.add(file);
    const text = (await wire(base + file, cookie, 'identity')).body.toString('utf8');
    const dir = file.slice(0, file.lastIndexOf('/') + 1);
    queue.push(...[...text.matchAll(/(?:import|from)\s*["'](\.\/[^"']+\.js)["']/g)].map((m) => dir + m[1]!.slice(2)));
    if (followDynamic) queue.push(...[...text.matchAll(/import\(\s*["'](\.\/[^"']+\.js)["']\s*\)/g)].map((m) => dir + m[1]!.slice(2)));
  }
  let identityBytes = page.body.length;
  let compressedBytes = (await wire(base + path, cookie, 'br, gzip')).body.length;
  let scriptCompressedBytes = 0;
  let encoding = '';
  for (const file of [...seen, ...new Set(styles)]) {
    const plain = await wire(base + file, cookie, 'identity');
    const packed = await wire(base + file, cookie, 'br, gzip');
    identityBytes += plain.body.length;
    compressedBytes += packed.body.length;
    if (file.endsWith('.js')) scriptCompressedBytes += packed.body.length;
    encoding ||= packed.encoding;
  }
  return { files: 1 + seen.size + new Set(styles).size, identityBytes, compressedBytes, encoding: encoding || 'none', scriptCompressedBytes };
}

function wire(url: string, cookie: string, acceptEncoding: string): Promise<{ body: Buffer; encoding: string }> {
  return new Promise((resolve, reject) => {
    http
      .get(url, { headers: { cookie, 'accept-encoding': acceptEncoding } }, (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => {
          if ((res.statusCode ?? 500) >= 400) reject(new Error(`${url}: ${res.statusCode}`));
          else resolve({ body: Buffer.concat(chunks), encoding: String(res.headers['content-encoding'] ?? '') });
        });
      })
      .on('error', reject);
  });
}

export const kb = (bytes: number) => `${(bytes / 1000).toFixed(1)} KB`;
