/**
 * The production entry: serves the built app (dist/server/entry.mjs, Astro's node adapter in
 * standalone mode) behind our own HTTP server, so the client's address comes from the socket and
 * from X-Forwarded-For only through proxies listed in TRUSTED_PROXIES. Astro reads the first
 * X-Forwarded-For value as `clientAddress`, so we replace the header with the one resolved address.
 * Run: `node --import tsx src/serve.ts` (HOST, PORT, ROUNDMARK_DIST as for the adapter).
 */
import { readFileSync } from 'node:fs';
import http from 'node:http';
import https from 'node:https';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { env, settings } from './server/env';
import { clientAddressOf, markAddressesResolved, trustProxies } from './server/http/client-address';

type NodeHandler = (req: http.IncomingMessage, res: http.ServerResponse) => void;

const trusted = trustProxies(env().TRUSTED_PROXIES);
process.env.ASTRO_NODE_AUTOSTART = 'disabled'; // we listen ourselves
const { ROUNDMARK_DIST, SERVER_CERT_PATH: cert, SERVER_KEY_PATH: key, HOST: host, PORT: port } = settings();
const dist = path.resolve(ROUNDMARK_DIST);
const { handler } = (await import(pathToFileURL(path.join(dist, 'server/entry.mjs')).href)) as { handler: NodeHandler };
markAddressesResolved();

const listener: NodeHandler = (req, res) => {
  req.headers['x-forwarded-for'] = clientAddressOf(req, trusted);
  handler(req, res);
};

const server = cert && key ? https.createServer({ cert: readFileSync(cert), key: readFileSync(key) }, listener) : http.createServer(listener);
server.listen(port, host, () => console.log(`Roundmark listening on ${cert && key ? 'https' : 'http'}://${host}:${port}`));

for (const signal of ['SIGTERM', 'SIGINT'] as const) {
  process.on(signal, () => {
    server.close(() => process.exit(0));
    server.closeAllConnections();
  });
}
