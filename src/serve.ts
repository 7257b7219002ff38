/**
 * The production entry: serves the built app (dist/server/entry.mjs, Astro's node adapter in
 * standalone mode) behind our own HTTP server, so the client's address comes from the socket and
 * from X-Forwarded-For only through proxies listed in TRUSTED_PROXIES. Astro reads the first
 * X-Forwarded-For value as `clientAddress`, so we replace the header with the one resolved address.
 * Answers are compressed here (gzip or Brotli, as the browser accepts) with the `compression`
 * package, so no reverse proxy is needed for that. With ROUNDMARK_APP_PROCESSES > 1 the port is
 * shared by that many processes (node:cluster); each is stateless, as any app instance must be.
 * The client files (dist/client) are served here with sirv from a list read once at start, in
 * the Brotli or gzip copy the build wrote beside each (src/build/production-server.ts); every
 * other request goes straight to Astro (the adapter in middleware mode), with no file-system
 * look-up on the way (the adapter's standalone handler stat-ed the disk for every page request).
 * Run the compiled file: `node dist/serve.mjs` (`npm run serve`; HOST, PORT, ROUNDMARK_DIST as for
 * the adapter). `node --import tsx src/serve.ts` runs the source the same way.
 */
import cluster from 'node:cluster';
import { readFileSync } from 'node:fs';
import http from 'node:http';
import https from 'node:https';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import compression from 'compression';
import sirv from 'sirv';
import { env, settings } from './server/env';
import { clientAddressOf, markAddressesResolved, trustProxies } from './server/http/client-address';

type NodeHandler = (req: http.IncomingMessage, res: http.ServerResponse) => void;

/** Hashed build assets never change under one name; browsers may keep them a year. */
const IMMUTABLE_PREFIX = '/_astro/';

const processes = settings().ROUNDMARK_APP_PROCESSES;
if (processes > 1 && cluster.isPrimary) {
  // The primary only keeps the serving processes running; a crashed one is replaced.
  let stopping = false;
  for (let i = 0; i < processes; i++) cluster.fork();
  cluster.on('exit', (worker, code) => {
    if (stopping) return;
    console.error(`app process ${worker.process.pid} ended (${code}); starting another`);
    cluster.fork();
  });
  for (const signal of ['SIGTERM', 'SIGINT'] as const) {
    process.on(signal, () => {
      stopping = true;
      for (const w of Object.values(cluster.workers ?? {})) w?.kill('SIGTERM');
      cluster.on('exit', () => {
        if (Object.keys(cluster.workers ?? {}).length === 0) process.exit(0);
      });
    });
  }
} else {
  await serve();
}

async function serve() {
  const trusted = trustProxies(env().TRUSTED_PROXIES);
  const { ROUNDMARK_DIST, SERVER_CERT_PATH: cert, SERVER_KEY_PATH: key, HOST: host, PORT: port } = settings();
  const dist = path.resolve(ROUNDMARK_DIST);
  const { handler: render } = (await import(pathToFileURL(path.join(dist, 'server/entry.mjs')).href)) as { handler: NodeHandler };
  markAddressesResolved();

  const clientFiles = sirv(path.join(dist, 'client'), {
    brotli: true,
    gzip: true,
    etag: true,
    setHeaders: (res, pathname) => {
      // Other public files (the icon, the card picture) keep their name across releases: an hour, then revalidated by ETag.
      res.setHeader('Cache-Control', pathname.startsWith(IMMUTABLE_PREFIX) ? 'public, max-age=31536000, immutable' : 'public, max-age=3600');
    },
  });
  // Dynamic text answers (pages, JSON) travel compressed; compression skips small bodies, types
  // that do not gain (images, video) and answers already encoded (the precompressed files), and
  // honours Accept-Encoding.
  const compress = compression() as unknown as (req: http.IncomingMessage, res: http.ServerResponse, next: () => void) => void;
  const listener: NodeHandler = (req, res) => {
    try {
      decodeURI(req.url ?? '/'); // as the adapter's standalone handler did: a malformed path is the client's mistake
    } catch {
      res.writeHead(400, { 'content-type': 'text/plain; charset=utf-8' }).end('Bad request.');
      return;
    }
    req.headers['x-forwarded-for'] = clientAddressOf(req, trusted);
    const toApp = () => render(req, res);
    compress(req, res, req.method === 'GET' || req.method === 'HEAD' ? () => clientFiles(req, res, toApp) : toApp);
  };

  const server = cert && key ? https.createServer({ cert: readFileSync(cert), key: readFileSync(key) }, listener) : http.createServer(listener);
  server.listen(port, host, () => console.log(`Roundmark listening on ${cert && key ? 'https' : 'http'}://${host}:${port}`));

  for (const signal of ['SIGTERM', 'SIGINT'] as const) {
    process.on(signal, () => {
      server.close(() => process.exit(0));
      server.closeAllConnections();
    });
  }
}
