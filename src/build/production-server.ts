import { readdir, readFile, stat, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import zlib from 'node:zlib';
import type { AstroIntegration } from 'astro';
import { build } from 'esbuild';

const brotli = promisify(zlib.brotliCompress);
const gzip = promisify(zlib.gzip);

/** Text files worth compressing ahead of time (images and fonts are compressed already). */
const TEXT_FILES = /\.(js|mjs|css|svg|html|json|txt|xml|vtt|webmanifest)$/;
/** Below this, headers outweigh the saving (compression's own default threshold is 1 KB too). */
const MIN_BYTES = 1024;

/**
 * Completes `astro build` for production:
 * - compiles src/serve.ts (our HTTP entry) and what it imports into `<outDir>/serve.mjs`, so the
 *   server runs as plain JavaScript. Under `node --import tsx` every module load and every dynamic
 *   `import()` of a page chunk went through tsx's resolve hooks, on every request;
 * - writes a Brotli (quality 11) and a gzip (level 9) copy beside every text asset of the client
 *   folder. Those levels are too slow to run per request (the `compression` middleware uses
 *   Brotli quality 4 for dynamic answers), but once at build time they cost nothing per request,
 *   and the browser gets the smallest file. src/serve.ts serves them (sirv's `brotli`/`gzip`).
 * Hand-written: the few lines of precompression below; packages for it are Vite plugins that
 * would run on Vite's output rather than on Astro's final client folder.
 */
export function productionServer(): AstroIntegration {
  let outDir: URL | undefined;
  let clientDir: URL | undefined;
  return {
    name: 'roundmark-production-server',
    hooks: {
      'astro:config:done': ({ config }) => {
        outDir = config.outDir;
        clientDir = config.build.client;
      },
      'astro:build:done': async ({ logger }) => {
        if (!outDir || !clientDir) throw new Error('astro:config:done did not run');
        await build({
          entryPoints: [fileURLToPath(new URL('../serve.ts', import.meta.url))],
          outfile: fileURLToPath(new URL('serve.mjs', outDir)),
          bundle: true,
          packages: 'external', // node_modules stay imports, resolved from the checkout as before
          platform: 'node',
          format: 'esm',
          target: 'node20',
          sourcemap: 'linked',
          logLevel: 'warning',
        });
        const { files, before, after } = await precompress(fileURLToPath(clientDir));
        logger.info(`serve.mjs written; ${files} client files precompressed (${kb(before)} → ${kb(after)} Brotli)`);
      },
    },
  };
}

async function precompress(dir: string) {
  let files = 0;
  let before = 0;
  let after = 0;
  const names = (await readdir(dir, { recursive: true })).filter((name) => TEXT_FILES.test(name));
  await Promise.all(
    names.map(async (name) => {
      const file = path.join(dir, name);
      if ((await stat(file)).size < MIN_BYTES) return;
      const body = await readFile(file);
      const [br, gz] = await Promise.all([
        brotli(body, { params: { [zlib.constants.BROTLI_PARAM_QUALITY]: zlib.constants.BROTLI_MAX_QUALITY, [zlib.constants.BROTLI_PARAM_SIZE_HINT]: body.length } }),
        gzip(body, { level: zlib.constants.Z_BEST_COMPRESSION }),
      ]);
      await Promise.all([writeFile(`${file}.br`, br), writeFile(`${file}.gz`, gz)]);
      files++;
      before += body.length;
      after += br.length;
    }),
  );
  return { files, before, after };
}

const kb = (bytes: number) => `${(bytes / 1000).toFixed(0)} KB`;
