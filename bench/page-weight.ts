import http from 'node:http';
import { chromium } from 'playwright-core';

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
 * Which scripts count for a page:
 * - `static`: those its HTML names and their static imports (what any visit downloads);
 * - `all-dynamic`: those plus every dynamic `import()` reachable from them. This was the only
 *   measure until December 2026. It overcounts: a chunk a page loads only in some states (the
 *   staff class page's uploader, needed only while a class has no usable recording) was counted on
 *   every page, next to chunks it excludes (the editor's HLS player, loaded once a recording is
 *   ready). Kept as an upper bound.
 * - `browser`: what Chromium really fetches when it opens the page signed in and the network
 *   settles (scripts the page's own code imports at load included, on-demand ones left out).
 */
export type ScriptSet = 'static' | 'all-dynamic' | 'browser';

/**
 * Fetches a page, its scripts (see ScriptSet) and stylesheets, each twice: `Accept-Encoding:
 * identity` (no compression, as before the server compressed) and `br, gzip` (what a browser asks
 * for). Counts body bytes as sent, before any decoding, so the figure is what crosses the wire.
 */
export async function pageWeight(base: string, path: string, cookie: string, scriptSet: ScriptSet): Promise<PageWeight> {
  const page = await wire(base + path, cookie, 'identity');
  const html = page.body.toString('utf8');
  const scripts = [...html.matchAll(/(?:src|component-url|renderer-url)="(\/_astro\/[^"]+\.js)"/g)].map((m) => m[1]!);
  const styles = [...html.matchAll(/<link[^>]+href="(\/_astro\/[^"]+\.css)"/g)].map((m) => m[1]!);
  const seen = new Set<string>(scriptSet === 'browser' ? await scriptsFetchedByBrowser(base, path, cookie) : []);
  const queue = scriptSet === 'browser' ? [] : [...scripts];
  while (queue.length) {
    const file = queue.shift()!;
    if (seen.has(file)) continue;
    seen.add(file);
    const text = (await wire(base + file, cookie, 'identity')).body.toString('utf8');
    const dir = file.slice(0, file.lastIndexOf('/') + 1);
    queue.push(...[...text.matchAll(/(?:import|from)\s*["'](\.\/[^"']+\.js)["']/g)].map((m) => dir + m[1]!.slice(2)));
    if (scriptSet === 'all-dynamic') queue.push(...[...text.matchAll(/import\(\s*["'](\.\/[^"']+\.js)["']\s*\)/g)].map((m) => dir + m[1]!.slice(2)));
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

/** The app's scripts Chromium downloads while opening `path` signed in, until the network is idle. */
async function scriptsFetchedByBrowser(base: string, path: string, cookie: string): Promise<string[]> {
  const browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium', headless: true, args: ['--no-sandbox', '--disable-gpu'] });
  try {
    const context = await browser.newContext();
    const [name, ...value] = cookie.split('=');
    await context.addCookies([{ name: name!, value: value.join('='), url: base }]);
    const page = await context.newPage();
    const fetched = new Set<string>();
    page.on('response', (res) => {
      const url = new URL(res.url());
      if (url.origin === base && url.pathname.startsWith('/_astro/') && url.pathname.endsWith('.js')) fetched.add(url.pathname);
    });
    await page.goto(base + path, { waitUntil: 'networkidle' });
    return [...fetched];
  } finally {
    await browser.close();
  }
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
