/**
 * The production entry: serves the built app (dist/server/entry.mjs, Astro's node adapter in
 * standalone mode) behind our own HTTP server, so the client's address comes from the socket and
 * from X-Forwarded-For only through proxies listed in TRUSTED_PROXIES. Astro reads the first
 * X-Forwarded-For value as `clientAddress`, so we replace the header with the one resolved address.
 * Answers are compressed here (gzip or Brotli, as the browser accepts) with the `compression`
 * package, so no reverse proxy is needed for that. With ROUNDMARK_APP_PROCESSES > 1 the port is
 * shared by that many processes (node:cluster); each is stateless, as any app instance must be.
 * Run: `node --import tsx src/serve.ts` (HOST, PORT, ROUNDMARK_DIST as for the adapter).
 */
import cluster from 'node:cluster';
import { readFileSync } from 'node:fs';
import http from 'node:http';
import https from 'node:https';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import compression from 'compression';
import { env, settings } from './server/env';
import { clientAddressOf, markAddressesResolved, trustProxies } from './server/http/client-address';

type NodeHandler = (req: http.IncomingMessage, res: http.ServerResponse) => void;

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
  process.env.ASTRO_NODE_AUTOSTART = 'disabled'; // we listen ourselves
  const { ROUNDMARK_DIST, SERVER_CERT_PATH: cert, SERVER_KEY_PATH: key, HOST: host, PORT: port } = settings();
  const dist = path.resolve(ROUNDMARK_DIST);
  const { handler } = (await import(pathToFileURL(path.join(dist, 'server/entry.mjs')).href)) as { handler: NodeHandler };
  markAddressesResolved();

  // Text answers (pages, scripts, styles, JSON) travel compressed; compression skips small bodies and
  // types that do not gain (images, video), and honours Accept-Encoding.
  const compress = compression() as unknown as (req: http.IncomingMessage, res: http.ServerResponse, next: () => void) => void;
  const listener: NodeHandler = (req, res) => {
    req.headers['x-forwarded-for'] = clientAddressOf(req, trusted);
    compress(req, res, () => handler(req, res));
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
