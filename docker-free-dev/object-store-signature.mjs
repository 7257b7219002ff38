// Signature checks for the local object store, so that it refuses what S3 refuses.
//
// s3rver 3.7.1 parses AWS Signature Version 4 but accepts any signature ("calculation is
// unimplemented"), so no test could prove that a presigned URL is right, that a tampered one is
// refused, or that an expired one stops working. This middleware recomputes every SigV4 signature
// with the AWS SDK's own signing package (@smithy/signature-v4: the canonical request and the
// string to sign are built by its SignatureV4 class, not by us) and answers like S3 does:
//   - no signature at all                        -> 403 AccessDenied (the bucket is private)
//   - unknown access key                         -> 403 InvalidAccessKeyId
//   - signature that does not match              -> 403 SignatureDoesNotMatch
//   - presigned URL past X-Amz-Date + X-Amz-Expires -> 403 AccessDenied "Request has expired"
//   - header-signed request dated over 15 min off -> 403 RequestTimeTooSkewed
//   - body whose SHA-256 differs from the signed x-amz-content-sha256 -> 400 XAmzContentSHA256Mismatch
// Rules from the Amazon S3 API Reference, "Authenticating Requests (AWS Signature Version 4)".
// Browser preflights (OPTIONS) carry no signature in S3 either and pass through to the CORS rules.
import { createHash, createHmac, timingSafeEqual } from 'node:crypto';
import { Readable } from 'node:stream';
import { createRequire } from 'node:module';
import { SignatureV4 } from '@smithy/signature-v4';

const require = createRequire(import.meta.url);
const S3Error = require('s3rver/lib/models/error');
const AWSAccount = require('s3rver/lib/models/account');

const ALGORITHM = 'AWS4-HMAC-SHA256';
const MAX_SKEW_MS = 15 * 60 * 1000; // S3 refuses header-signed requests more than 15 minutes off
const MAX_EXPIRES_S = 7 * 24 * 3600; // presigned URLs live at most seven days
const UNSIGNED_PAYLOAD = 'UNSIGNED-PAYLOAD';
const HEX_SHA256 = /^[0-9a-f]{64}$/;
const LONG_DATE = /^(\d{4})(\d{2})(\d{2})T(\d{2})(\d{2})(\d{2})Z$/;
// Bodies whose hash was signed are read before the store sees them; the local store holds them
// in memory for that, so an over-large one is refused rather than exhausting the process.
const MAX_HASHED_BODY_BYTES = 256 * 1024 * 1024;

/** The hash interface the signer expects (SHA-256, or HMAC-SHA256 when given a key), over node:crypto. */
class Sha256 {
  constructor(secret) {
    this.hash = secret ? createHmac('sha256', Buffer.from(secret)) : createHash('sha256');
  }
  update(data) {
    this.hash.update(data);
  }
  async digest() {
    return new Uint8Array(this.hash.digest());
  }
}

function parseLongDate(value) {
  const m = LONG_DATE.exec(value ?? '');
  if (!m) return null;
  return new Date(Date.UTC(+m[1], +m[2] - 1, +m[3], +m[4], +m[5], +m[6]));
}

function accessDenied(message = 'Access Denied') {
  return new S3Error('AccessDenied', message);
}

function malformed(message) {
  return new S3Error('AuthorizationQueryParametersError', message);
}

/** Splits the raw request target into its (still encoded) path and decoded query pairs. */
function splitTarget(rawUrl) {
  const at = rawUrl.indexOf('?');
  const path = at === -1 ? rawUrl : rawUrl.slice(0, at);
  const query = {};
  const raw = at === -1 ? '' : rawUrl.slice(at + 1);
  for (const piece of raw.split('&')) {
    if (!piece) continue;
    const eq = piece.indexOf('=');
    const name = decodeURIComponent(eq === -1 ? piece : piece.slice(0, eq));
    const value = eq === -1 ? '' : decodeURIComponent(piece.slice(eq + 1));
    if (name in query) query[name] = [].concat(query[name], value);
    else query[name] = value;
  }
  return { path, query };
}

/** The signature's parts, from the Authorization header or the presigned query. */
function readAuthorization(ctx, query) {
  const header = ctx.get('Authorization');
  if (header) {
    const m = /^AWS4-HMAC-SHA256\s+Credential=([^,\s]+),\s*SignedHeaders=([^,\s]+),\s*Signature=([0-9a-f]{64})$/.exec(header.trim());
    if (!m) {
      // Signature Version 2 and malformed headers: S3 answers these with a 400 too.
      throw new S3Error('InvalidRequest', 'Only AWS4-HMAC-SHA256 Authorization headers are accepted.');
    }
    return {
      presigned: false,
      credential: m[1],
      signedHeaders: m[2],
      signature: m[3],
      longDate: ctx.get('x-amz-date'),
      payloadHash: ctx.get('x-amz-content-sha256'),
    };
  }
  if (query['X-Amz-Algorithm'] !== ALGORITHM) throw malformed(`X-Amz-Algorithm must be ${ALGORITHM}.`);
  for (const name of ['X-Amz-Credential', 'X-Amz-Date', 'X-Amz-Expires', 'X-Amz-SignedHeaders', 'X-Amz-Signature']) {
    if (typeof query[name] !== 'string' || !query[name]) throw malformed(`Query-string authentication requires ${name}.`);
  }
  const expires = Number(query['X-Amz-Expires']);
  if (!/^\d+$/.test(query['X-Amz-Expires']) || expires < 1 || expires > MAX_EXPIRES_S) {
    throw malformed(`X-Amz-Expires must be between 1 and ${MAX_EXPIRES_S} seconds.`);
  }
  return {
    presigned: true,
    credential: query['X-Amz-Credential'],
    signedHeaders: query['X-Amz-SignedHeaders'],
    signature: query['X-Amz-Signature'],
    longDate: query['X-Amz-Date'],
    expires,
    // Presigned S3 URLs sign no payload (S3 API Reference, "Authenticating Requests: Using Query Parameters").
    payloadHash: UNSIGNED_PAYLOAD,
  };
}

function checkTime(auth, now) {
  const signedAt = parseLongDate(auth.longDate);
  if (!signedAt) throw accessDenied('The request has no valid X-Amz-Date.');
  if (auth.presigned) {
    if (now > signedAt.getTime() + auth.expires * 1000) throw accessDenied('Request has expired');
    if (signedAt.getTime() - now > MAX_SKEW_MS) throw accessDenied('Request is not valid yet');
  } else if (Math.abs(now - signedAt.getTime()) > MAX_SKEW_MS) {
    throw new S3Error('RequestTimeTooSkewed', 'The difference between the request time and the current time is too large.');
  }
  return signedAt;
}

/** Recomputes the signature with the SDK's signer from exactly what the client sent. */
async function expectedSignature(ctx, auth, scopeParts, signedAt, secretAccessKey) {
  const [accessKeyId, shortDate, region, service] = scopeParts;
  const signer = new SignatureV4({
    credentials: { accessKeyId, secretAccessKey },
    region,
    service,
    sha256: Sha256,
    uriEscapePath: false, // S3 signs the path as sent, encoded once
  });
  const { path, query } = splitTarget(ctx.req.url);
  delete query['X-Amz-Signature'];
  const canonicalHeaders = {};
  for (const name of auth.signedHeaders.split(';')) {
    const value = ctx.req.headers[name];
    if (value === undefined) throw accessDenied(`Signed header ${name} is missing from the request.`);
    canonicalHeaders[name] = String(value).trim().replace(/\s+/g, ' ');
  }
  const canonicalRequest = signer.createCanonicalRequest(
    { method: ctx.method, path, query, headers: canonicalHeaders },
    canonicalHeaders,
    auth.payloadHash,
  );
  const scope = `${shortDate}/${region}/${service}/aws4_request`;
  const stringToSign = await signer.createStringToSign(auth.longDate, scope, canonicalRequest, ALGORITHM);
  return signer.signString(stringToSign, { signingDate: signedAt, signingRegion: region, signingService: service });
}

/** Reads the body, checks it against the signed SHA-256 and hands the same bytes on to the store. */
async function checkBodyHash(ctx, signedHash) {
  const chunks = [];
  let size = 0;
  const hash = createHash('sha256');
  for await (const chunk of ctx.req) {
    size += chunk.length;
    if (size > MAX_HASHED_BODY_BYTES) throw new S3Error('EntityTooLarge', 'The local store reads at most 256 MiB of a hash-signed body.');
    hash.update(chunk);
    chunks.push(chunk);
  }
  if (hash.digest('hex') !== signedHash) {
    const mismatch = new S3Error('XAmzContentSHA256Mismatch', 'The provided x-amz-content-sha256 header does not match what was computed.');
    mismatch.status = 400; // s3rver's table does not know this S3 code
    mismatch.expose = true;
    throw mismatch;
  }
  // s3rver reads the body from ctx.req; give it a stream of the bytes already read.
  const replay = Readable.from(chunks.length ? [Buffer.concat(chunks)] : []);
  replay.headers = ctx.req.headers;
  ctx.req = replay;
}

async function verify(ctx) {
  const { query } = splitTarget(ctx.req.url);
  const hasHeader = Boolean(ctx.get('Authorization'));
  const hasQuery = 'X-Amz-Algorithm' in query || 'X-Amz-Signature' in query;
  if (!hasHeader && !hasQuery) throw accessDenied();
  if (hasHeader && hasQuery) throw new S3Error('InvalidArgument', 'Only one authentication mechanism is allowed.');

  const auth = readAuthorization(ctx, query);
  const scopeParts = auth.credential.split('/');
  if (scopeParts.length !== 5 || scopeParts[4] !== 'aws4_request') throw malformed('X-Amz-Credential is malformed.');
  const [accessKeyId, shortDate] = scopeParts;
  const account = AWSAccount.registry.get(accessKeyId);
  const secretAccessKey = account?.accessKeys.get(accessKeyId);
  if (!secretAccessKey) {
    throw new S3Error('InvalidAccessKeyId', 'The AWS Access Key Id you provided does not exist in our records.');
  }
  const signedAt = checkTime(auth, Date.now());
  if (!auth.longDate.startsWith(shortDate)) throw accessDenied('The credential date does not match X-Amz-Date.');
  if (!auth.signedHeaders.split(';').includes('host')) throw accessDenied('The host header must be signed.');
  if (!auth.presigned && !auth.payloadHash) throw new S3Error('InvalidRequest', 'Missing required header for this request: x-amz-content-sha256');

  const expected = await expectedSignature(ctx, auth, scopeParts, signedAt, secretAccessKey);
  const given = Buffer.from(auth.signature, 'hex');
  if (given.length !== 32 || !timingSafeEqual(given, Buffer.from(expected, 'hex'))) {
    throw new S3Error(
      'SignatureDoesNotMatch',
      'The request signature we calculated does not match the signature you provided. Check your key and signing method.',
    );
  }
  if (!auth.presigned && HEX_SHA256.test(auth.payloadHash)) await checkBodyHash(ctx, auth.payloadHash);
}

/**
 * Koa middleware placed before s3rver's router. Refusals go through `onRefused` so they carry
 * the bucket's CORS headers (a browser can then read why its upload was refused).
 */
export function signatureCheck({ onRefused }) {
  return async function signatureCheck(ctx, next) {
    if (ctx.method === 'OPTIONS') return next();
    try {
      await verify(ctx);
    } catch (err) {
      if (err instanceof S3Error) return onRefused(ctx, err);
      throw err;
    }
    return next();
  };
}
