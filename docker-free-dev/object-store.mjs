// Local S3-compatible object store for development and tests: s3rver 3.7.1 plus the two
// multipart operations it lacks (ListParts and AbortMultipartUpload answer 405 in s3rver).
// Resumable and cancellable browser uploads need both, so they are added here as one Koa
// middleware placed just before s3rver's router. Completing an upload keeps the stored parts
// and reads across them (./object-store-parts.mjs) instead of copying them into one file, as S3
// does not copy either. Everything else is s3rver unchanged.
//
//   node docker-free-dev/object-store.mjs
//   env: ROUNDMARK_S3_PORT (4569), ROUNDMARK_S3_DIR (.data/s3 under the repo root),
//        S3_BUCKET (roundmark-media)
//
// Signatures are verified like S3 does (./object-store-signature.mjs): s3rver alone accepts any.
import fs from 'node:fs/promises';
import http from 'node:http';
import path from 'node:path';
import { createRequire } from 'node:module';
import { fileURLToPath } from 'node:url';

const require = createRequire(import.meta.url);
const S3rver = require('s3rver');
// s3rver's own pieces, reused so the add-on answers exactly like the rest of the store
// (same CORS rules, same auth checks, same XML error bodies).
const S3Error = require('s3rver/lib/models/error');
const corsMiddleware = require('s3rver/lib/middleware/cors');
const authenticationMiddleware = require('s3rver/lib/middleware/authentication');
const bucketController = require('s3rver/lib/controllers/bucket');
const objectController = require('s3rver/lib/controllers/object');

import { PartsAwareStore } from './object-store-parts.mjs';
import { signatureCheck } from './object-store-signature.mjs';

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const host = '127.0.0.1';
const port = Number(process.env.ROUNDMARK_S3_PORT || 4569);
const bucket = process.env.S3_BUCKET || 'roundmark-media';
const directory = process.env.ROUNDMARK_S3_DIR
  ? path.resolve(process.env.ROUNDMARK_S3_DIR)
  : path.join(repoRoot, '.data', 's3');

// The browser uploads straight to the store, so it must allow these methods from the app's
// origin and let the page read ETag (the upload needs each part's ETag to complete).
const corsXml = `<CORSConfiguration>
  <CORSRule>
    <AllowedOrigin>*</AllowedOrigin>
    <AllowedMethod>GET</AllowedMethod>
    <AllowedMethod>PUT</AllowedMethod>
    <AllowedMethod>POST</AllowedMethod>
    <AllowedMethod>DELETE</AllowedMethod>
    <AllowedMethod>HEAD</AllowedMethod>
    <AllowedHeader>*</AllowedHeader>
    <ExposeHeader>ETag</ExposeHeader>
    <MaxAgeSeconds>3000</MaxAgeSeconds>
  </CORSRule>
</CORSConfiguration>`;

const MAX_PARTS_LIMIT = 1000; // S3 never returns more than 1000 parts per page
const S3_XMLNS = 'http://s3.amazonaws.com/doc/2006-03-01/';
const SUBRESOURCES = [...new Set([...bucketController.METHODS, ...objectController.METHODS])];

// ---------------------------------------------------------------------------------------------
// Multipart add-on
// ---------------------------------------------------------------------------------------------

/** Where s3rver 3.7.1 keeps an upload: <dir>/<bucket>/._S3rver_uploads/<uploadId>/{key,metadata,N,N.md5}. */
function uploadDir(store, bucketName, uploadId) {
  return path.join(store.getResourcePath(bucketName, undefined, 'uploads'), uploadId);
}

function noSuchUpload(uploadId) {
  return new S3Error(
    'NoSuchUpload',
    'The specified upload does not exist. The upload ID may be invalid, or the upload may have ' +
      'been aborted or completed.',
    { UploadId: uploadId },
  );
}

/**
 * Resolves the upload's folder, or throws NoSuchUpload when the id is unknown, malformed
 * (it becomes a path, so only plain tokens are accepted) or was started for another key.
 */
async function findUpload(ctx) {
  const { bucket: bucketName, key } = ctx.params;
  const uploadId = String(ctx.query.uploadId);
  if (!/^[A-Za-z0-9_-]{1,128}$/.test(uploadId)) throw noSuchUpload(uploadId);
  const dir = uploadDir(ctx.store, bucketName, uploadId);
  const storedKey = await fs.readFile(path.join(dir, 'key'), 'utf8').catch((err) => {
    if (err.code === 'ENOENT' || err.code === 'ENOTDIR') return null;
    throw err;
  });
  if (storedKey !== key) throw noSuchUpload(uploadId);
  return { uploadId, dir };
}

function integerParam(ctx, name, fallback) {
  const raw = ctx.query[name];
  if (raw === undefined || raw === '') return fallback;
  const value = Number(raw);
  if (!/^\d+$/.test(String(raw)) || !Number.isSafeInteger(value) || value > 2147483647) {
    throw new S3Error('InvalidArgument', `Argument ${name} must be an integer between 0 and 2147483647`, {
      ArgumentName: name,
      ArgumentValue: String(raw),
    });
  }
  return value;
}

/** ListParts: GET /bucket/key?uploadId=…[&max-parts=N][&part-number-marker=M] */
async function listParts(ctx) {
  const { uploadId, dir } = await findUpload(ctx);
  const maxParts = Math.min(integerParam(ctx, 'max-parts', MAX_PARTS_LIMIT), MAX_PARTS_LIMIT);
  const marker = integerParam(ctx, 'part-number-marker', 0);

  // A part counts once s3rver has written its .md5, which it does after the data is complete;
  // a part still streaming in is not listed (as in S3, where it is not visible until stored).
  const names = new Set(await fs.readdir(dir));
  const numbers = [...names]
    .filter((name) => /^\d+$/.test(name) && names.has(`${name}.md5`))
    .map(Number)
    .filter((n) => n > marker)
    .sort((a, b) => a - b);
  const page = numbers.slice(0, maxParts);
  const isTruncated = numbers.length > page.length;

  const parts = await Promise.all(
    page.map(async (n) => {
      const file = path.join(dir, String(n));
      const [stat, md5] = await Promise.all([fs.stat(file), fs.readFile(`${file}.md5`, 'utf8')]);
      return {
        PartNumber: n,
        LastModified: stat.mtime.toISOString(),
        ETag: JSON.stringify(md5.trim()),
        Size: stat.size,
      };
    }),
  );

  // A plain object body is serialised to XML by s3rver's own response middleware.
  ctx.body = {
    ListPartsResult: {
      '@': { xmlns: S3_XMLNS },
      Bucket: ctx.params.bucket,
      Key: ctx.params.key,
      UploadId: uploadId,
      PartNumberMarker: marker,
      NextPartNumberMarker: page.length ? page[page.length - 1] : marker,
      MaxParts: maxParts,
      IsTruncated: isTruncated,
      StorageClass: 'STANDARD',
      ...(parts.length ? { Part: parts } : {}),
    },
  };
}

/** AbortMultipartUpload: DELETE /bucket/key?uploadId=… removes every stored part. */
async function abortMultipartUpload(ctx) {
  const { dir } = await findUpload(ctx);
  await fs.rm(dir, { recursive: true, force: true });
  ctx.status = 204;
}

/**
 * Handles ListParts and AbortMultipartUpload, and makes UploadPart and CompleteMultipartUpload
 * answer NoSuchUpload for an unknown or aborted upload as S3 does (s3rver would otherwise
 * recreate the folder for a late part, or fail with a 500 on complete).
 */
function multipartAddOn() {
  const cors = corsMiddleware();
  const authenticate = authenticationMiddleware();
  return async function multipartAddOn(ctx, next) {
    // HeadBucket: s3rver answers it as a bucket listing (walking every stored file, which takes
    // longer the more media is stored); S3 only checks that the bucket exists.
    const bucketOnly = /^\/([^/]+)\/?$/.exec(ctx.path);
    if (ctx.method === 'HEAD' && bucketOnly && Object.keys(ctx.query).length === 0) {
      ctx.params = { bucket: decodeURIComponent(bucketOnly[1]) };
      return cors(ctx, () => authenticate(ctx, () => bucketController.bucketExists(ctx, async () => {
        ctx.status = 200;
      })));
    }
    const match = /^\/([^/]+)\/(.+)$/.exec(ctx.path);
    const subresources = SUBRESOURCES.filter((name) => name in ctx.query);
    if (!match || subresources.length !== 1 || subresources[0] !== 'uploadId') return next();
    if (!['GET', 'DELETE', 'PUT', 'POST'].includes(ctx.method)) return next();

    ctx.params = { bucket: decodeURIComponent(match[1]), key: decodeURIComponent(match[2]) };
    // Same order as s3rver's router: CORS headers first, so error bodies carry them too.
    await cors(ctx, () =>
      authenticate(ctx, () =>
        bucketController.bucketExists(ctx, async () => {
          if (ctx.method === 'GET') return listParts(ctx);
          if (ctx.method === 'DELETE') return abortMultipartUpload(ctx);
          await findUpload(ctx); // PUT (UploadPart) and POST (Complete): s3rver does the work
          return next();
        }),
      ),
    );
  };
}

// ---------------------------------------------------------------------------------------------
// Start-up
// ---------------------------------------------------------------------------------------------

await fs.mkdir(directory, { recursive: true });
const store = new S3rver({
  address: host,
  port,
  directory,
  silent: true,
  vhostBuckets: false,
  configureBuckets: [{ name: bucket, configs: [corsXml] }],
});
store.store = store.context.store = new PartsAwareStore(directory);

// s3rver registers its router last; the add-on goes right before it so it sees requests after
// s3rver's logging, XML encoding and host handling.
const routerIndex = store.middleware.findIndex((fn) => fn.router);
if (routerIndex === -1) {
  console.error('object store: could not find s3rver 3.7.1 router (was s3rver upgraded?)');
  process.exit(1);
}
const cors = corsMiddleware();
function refuseWithCors(ctx, err) {
  const bucketName = /^\/([^/?]+)/.exec(ctx.path)?.[1];
  if (!bucketName) throw err;
  ctx.params = { ...ctx.params, bucket: decodeURIComponent(bucketName) };
  return cors(ctx, () => {
    throw err;
  });
}
store.middleware.splice(routerIndex, 0, signatureCheck({ onRefused: refuseWithCors }), multipartAddOn());

await store.configureBuckets();

// Our own HTTP server rather than store.run(): s3rver's listen never reports EADDRINUSE.
const server = http.createServer(store.callback());
server.on('error', (err) => {
  if (err.code === 'EADDRINUSE') {
    console.error(
      `object store: port ${port} on ${host} is already in use ` +
        '(another object store running? set ROUNDMARK_S3_PORT to use another port)',
    );
  } else {
    console.error(`object store: could not listen on ${host}:${port}: ${err.message}`);
  }
  process.exit(1);
});
server.listen(port, host, () => {
  const shownDir = path.relative(repoRoot, directory).startsWith('..')
    ? directory
    : path.relative(repoRoot, directory) || '.';
  console.log(`object store  http://${host}:${port}  bucket ${bucket}  data ${shownDir}`);
});

let stopping = false;
function stop(signal) {
  if (stopping) process.exit(1); // second signal: do not wait any longer
  stopping = true;
  server.close(() => {
    store.logger.close();
    console.log(`object store stopped (${signal})`);
    process.exit(0);
  });
  server.closeIdleConnections();
  // In-flight uploads get a moment to finish, then they are cut.
  setTimeout(() => server.closeAllConnections(), 2000).unref();
}
process.on('SIGTERM', () => stop('SIGTERM'));
process.on('SIGINT', () => stop('SIGINT'));
