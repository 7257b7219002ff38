// The local object store checks AWS Signature Version 4 like S3 (docker-free-dev/object-store-signature.mjs),
// so these tests prove that the links the app signs are right and that a changed, stripped or
// expired link is refused. Expected answers follow the Amazon S3 API Reference ("Authenticating
// Requests (AWS Signature Version 4)" and "Error responses": 403 SignatureDoesNotMatch,
// 403 AccessDenied "Request has expired", 400 XAmzContentSHA256Mismatch).
// Every request goes to the running store; the signatures come from the AWS SDK's own signer.
import { createHash, createHmac, randomBytes, randomUUID } from 'node:crypto';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  AbortMultipartUploadCommand,
  CreateMultipartUploadCommand,
  DeleteObjectCommand,
  GetObjectCommand,
  PutObjectCommand,
  S3Client,
  UploadPartCommand,
} from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import { SignatureV4 } from '@smithy/signature-v4';
import { DEMO, signedIn, type ApiClient } from '../helpers/api-client';
import { createSmallClass } from '../helpers/published-class';
import { STORE_ORIGIN } from '../helpers/media-fetch';

const endpoint = process.env.S3_ENDPOINT ?? STORE_ORIGIN;
const Bucket = process.env.S3_BUCKET ?? 'roundmark-media';
const region = process.env.S3_REGION ?? 'us-east-1';
const credentials = {
  accessKeyId: process.env.S3_ACCESS_KEY_ID ?? 'S3RVER',
  secretAccessKey: process.env.S3_SECRET_ACCESS_KEY ?? 'S3RVER',
};
const s3 = new S3Client({ endpoint, region, credentials, forcePathStyle: true });
const prefix = `tests/signatures/${randomUUID()}`;

/** The store's S3 error code, read from the XML body as an S3 client would. */
async function errorCode(res: Response): Promise<string | undefined> {
  return /<Code>([^<]+)<\/Code>/.exec(await res.text())?.[1];
}

/** Changes one query value of a signed URL, keeping everything else as signed. */
function withQuery(url: string, name: string, value: string): string {
  const u = new URL(url);
  u.searchParams.set(name, value);
  return u.toString();
}

describe('presigned upload parts', () => {
  let Key: string;
  let UploadId: string;
  beforeAll(async () => {
    Key = `${prefix}/part-test.mp4`;
    ({ UploadId } = (await s3.send(new CreateMultipartUploadCommand({ Bucket, Key }))) as { UploadId: string });
  });
  afterAll(() => s3.send(new AbortMultipartUploadCommand({ Bucket, Key, UploadId })).catch(() => {}));

  const partUrl = (options: { expiresIn?: number; signingDate?: Date } = {}) =>
    getSignedUrl(s3, new UploadPartCommand({ Bucket, Key, UploadId, PartNumber: 1 }), { expiresIn: 600, ...options });

  it('accepts the part URL as signed', async () => {
    const res = await fetch(await partUrl(), { method: 'PUT', body: randomBytes(1024) });
    expect(res.status).toBe(200);
    expect(res.headers.get('etag')).toBeTruthy();
  });

  it('refuses the same URL with one query value changed (the part number, or a longer life)', async () => {
    const url = await partUrl();
    for (const tampered of [withQuery(url, 'partNumber', '2'), withQuery(url, 'X-Amz-Expires', '604800')]) {
      const res = await fetch(tampered, { method: 'PUT', body: randomBytes(16) });
      expect(res.status).toBe(403);
      expect(await errorCode(res)).toBe('SignatureDoesNotMatch');
    }
  });

  it('refuses it after it expired (signed two hours ago for one hour; no waiting)', async () => {
    const url = await partUrl({ expiresIn: 3600, signingDate: new Date(Date.now() - 2 * 3600 * 1000) });
    const res = await fetch(url, { method: 'PUT', body: randomBytes(16) });
    expect(res.status).toBe(403);
    expect(await errorCode(res)).toBe('AccessDenied');
  });

  it('refuses it without its signature, or signed with another secret', async () => {
    const unsigned = new URL(await partUrl());
    unsigned.search = `?partNumber=1&uploadId=${UploadId}`;
    const bare = await fetch(unsigned, { method: 'PUT', body: randomBytes(16) });
    expect(bare.status).toBe(403);
    expect(await errorCode(bare)).toBe('AccessDenied');

    const stranger = new S3Client({ endpoint, region, forcePathStyle: true, credentials: { ...credentials, secretAccessKey: 'not-the-secret' } });
    const forged = await getSignedUrl(stranger, new UploadPartCommand({ Bucket, Key, UploadId, PartNumber: 1 }), { expiresIn: 600 });
    const res = await fetch(forged, { method: 'PUT', body: randomBytes(16) });
    expect(res.status).toBe(403);
    expect(await errorCode(res)).toBe('SignatureDoesNotMatch');
  });
});

describe('header-signed writes', () => {
  const Key = `${prefix}/header-signed.bin`;
  afterAll(() => s3.send(new DeleteObjectCommand({ Bucket, Key })).catch(() => {}));

  /** Signs a PUT of `body` with its SHA-256 in x-amz-content-sha256, as the SDK does over plain HTTP. */
  async function signedPut(body: Buffer) {
    const url = new URL(`${endpoint}/${Bucket}/${Key}`);
    const signer = new SignatureV4({ credentials, region, service: 's3', sha256: NodeSha256, uriEscapePath: false });
    return signer.sign({
      method: 'PUT',
      protocol: url.protocol,
      hostname: url.hostname,
      port: Number(url.port),
      path: url.pathname,
      query: {},
      headers: {
        host: url.host,
        'content-length': String(body.length),
        'x-amz-content-sha256': createHash('sha256').update(body).digest('hex'),
      },
    });
  }

  it('stores a body that matches its signed checksum, and refuses another body under the same signature', async () => {
    const body = randomBytes(4096);
    const signed = await signedPut(body);
    const url = `${endpoint}/${Bucket}/${Key}`;
    const { host: _host, ...headers } = signed.headers;
    const ok = await fetch(url, { method: 'PUT', headers, body });
    expect(ok.status).toBe(200);

    const other = randomBytes(4096);
    const res = await fetch(url, { method: 'PUT', headers, body: other });
    expect(res.status).toBe(400);
    expect(await errorCode(res)).toBe('XAmzContentSHA256Mismatch');
    // Nothing of the refused body was stored: the object still holds the first one.
    const stored = await s3.send(new GetObjectCommand({ Bucket, Key }));
    expect(Buffer.from(await stored.Body!.transformToByteArray()).equals(body)).toBe(true);
  });

  it('refuses a signed header changed after signing', async () => {
    const body = randomBytes(64);
    const signed = await signedPut(body);
    const { host: _host, ...headers } = signed.headers;
    const res = await fetch(`${endpoint}/${Bucket}/${Key}`, {
      method: 'PUT',
      headers: { ...headers, 'x-amz-date': headers['x-amz-date']!.replace(/\d{2}Z$/, (s) => `${String((Number(s.slice(0, 2)) + 1) % 60).padStart(2, '0')}Z`) },
      body,
    });
    expect(res.status).toBe(403);
    expect(await errorCode(res)).toBe('SignatureDoesNotMatch');
  });

  it('still accepts the SDK’s own requests (put, get)', async () => {
    const body = randomBytes(256);
    await s3.send(new PutObjectCommand({ Bucket, Key, Body: body }));
    const out = await s3.send(new GetObjectCommand({ Bucket, Key }));
    expect(Buffer.from(await out.Body!.transformToByteArray()).equals(body)).toBe(true);
  });
});

describe('media links a member receives', () => {
  let dir: string;
  let coach: ApiClient;
  let first: { recordingId: string };
  let second: { recordingId: string };
  beforeAll(async () => {
    dir = await mkdtemp(join(tmpdir(), 'roundmark-signatures-'));
    coach = await signedIn(DEMO.coach);
    first = await createSmallClass(coach, dir, `Signed links A ${Date.now()}`);
    second = await createSmallClass(coach, dir, `Signed links B ${Date.now()}`);
  }, 300_000);
  afterAll(() => rm(dir, { recursive: true, force: true }));

  /** The first segment link of a recording's first variant, as the app rewrites it. */
  async function firstSegmentUrl(recordingId: string): Promise<string> {
    const master = await (await coach.get(`/media/${recordingId}/hls/master.m3u8`)).text();
    const variant = master.split('\n').find((line) => line && !line.startsWith('#'))!;
    const playlist = await (await coach.get(new URL(variant, `http://app/media/${recordingId}/hls/`).pathname)).text();
    const segment = playlist.split('\n').find((line) => line && !line.startsWith('#'))!;
    expect(segment.startsWith(STORE_ORIGIN)).toBe(true);
    return segment;
  }

  it('serves a segment through its signed link, and refuses it tampered, moved to another recording, or stripped', async () => {
    const url = await firstSegmentUrl(first.recordingId);
    expect((await fetch(url)).status).toBe(200);

    const other = new URL(await firstSegmentUrl(second.recordingId));
    const moved = new URL(url);
    moved.pathname = other.pathname; // the other recording's segment under this recording's signature
    const stripped = new URL(url);
    stripped.search = '';
    const cases = [
      { url: withQuery(url, 'X-Amz-Expires', '604800'), code: 'SignatureDoesNotMatch' },
      { url: moved.toString(), code: 'SignatureDoesNotMatch' },
      { url: stripped.toString(), code: 'AccessDenied' },
    ];
    for (const c of cases) {
      const res = await fetch(c.url);
      expect({ url: c.url, status: res.status, code: await errorCode(res) }).toEqual({ url: c.url, status: 403, code: c.code });
    }
  });

  it('refuses the same segment through a link that has expired (dated two hours back; no waiting)', async () => {
    const Key = decodeURIComponent(new URL(await firstSegmentUrl(first.recordingId)).pathname.replace(`/${Bucket}/`, ''));
    const expired = await getSignedUrl(s3, new GetObjectCommand({ Bucket, Key }), {
      expiresIn: 3600,
      signingDate: new Date(Date.now() - 2 * 3600 * 1000),
    });
    const res = await fetch(expired);
    expect(res.status).toBe(403);
    expect(await errorCode(res)).toBe('AccessDenied');
  });
});

/** SHA-256 / HMAC-SHA256 in the shape the SDK's signer takes. */
class NodeSha256 {
  private readonly hash;
  constructor(secret?: string | ArrayBuffer | ArrayBufferView) {
    this.hash = secret ? createHmac('sha256', bytes(secret)) : createHash('sha256');
  }
  update(data: string | ArrayBuffer | ArrayBufferView) {
    this.hash.update(bytes(data));
  }
  async digest() {
    return new Uint8Array(this.hash.digest());
  }
}

function bytes(data: string | ArrayBuffer | ArrayBufferView): string | Buffer {
  if (typeof data === 'string') return data;
  return ArrayBuffer.isView(data) ? Buffer.from(data.buffer, data.byteOffset, data.byteLength) : Buffer.from(data);
}
