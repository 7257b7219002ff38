// The local object store (docker-free-dev/object-store.mjs) must behave like S3 for what the
// app and the browser upload use, including the two multipart operations we add to s3rver.
// Talks to the running store through the real SDK; nothing is mocked.
import { createHash, randomBytes, randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  AbortMultipartUploadCommand,
  CompleteMultipartUploadCommand,
  CreateMultipartUploadCommand,
  DeleteObjectCommand,
  GetObjectCommand,
  HeadBucketCommand,
  HeadObjectCommand,
  ListPartsCommand,
  PutObjectCommand,
  S3Client,
  UploadPartCommand,
} from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';

const endpoint = process.env.S3_ENDPOINT ?? `http://127.0.0.1:${process.env.ROUNDMARK_S3_PORT ?? 4569}`;
const Bucket = process.env.S3_BUCKET ?? 'roundmark-media';
const appOrigin = 'http://127.0.0.1:4321';
const MiB = 1024 * 1024;

const s3 = new S3Client({
  endpoint,
  region: process.env.S3_REGION ?? 'us-east-1',
  credentials: {
    accessKeyId: process.env.S3_ACCESS_KEY_ID ?? 'S3RVER',
    secretAccessKey: process.env.S3_SECRET_ACCESS_KEY ?? 'S3RVER',
  },
  forcePathStyle: true,
  requestChecksumCalculation: 'WHEN_REQUIRED',
  responseChecksumValidation: 'WHEN_REQUIRED',
});

/** Every key of this run sits under one prefix, removed at the end. */
const prefix = `tests/object-store/${randomUUID()}`;
const createdKeys: string[] = [];
const openUploads: { Key: string; UploadId: string }[] = [];

const md5 = (data: Uint8Array) => createHash('md5').update(data).digest('hex');
const quoted = (hash: string) => `"${hash}"`;

async function readObject(Key: string): Promise<Buffer> {
  const out = await s3.send(new GetObjectCommand({ Bucket, Key }));
  return Buffer.from(await out.Body!.transformToByteArray());
}

async function startUpload(name: string): Promise<{ Key: string; UploadId: string }> {
  const Key = `${prefix}/${name}`;
  const { UploadId } = await s3.send(new CreateMultipartUploadCommand({ Bucket, Key, ContentType: 'video/mp4' }));
  expect(UploadId).toBeTruthy();
  const upload = { Key, UploadId: UploadId! };
  openUploads.push(upload);
  return upload;
}

const noSuchUpload = { name: 'NoSuchUpload', $metadata: { httpStatusCode: 404 } };

beforeAll(async () => {
  try {
    await s3.send(new HeadBucketCommand({ Bucket }));
  } catch (err) {
    throw new Error(
      `Object store not reachable at ${endpoint} (bucket ${Bucket}): start it with ` +
        `"node docker-free-dev/object-store.mjs" (${(err as Error).name})`,
    );
  }
});

afterAll(async () => {
  for (const { Key, UploadId } of openUploads) {
    await s3.send(new AbortMultipartUploadCommand({ Bucket, Key, UploadId })).catch(() => {});
  }
  for (const Key of createdKeys) {
    await s3.send(new DeleteObjectCommand({ Bucket, Key })).catch(() => {});
  }
});

describe('object store: buckets', () => {
  it('answers HeadBucket for the bucket, and NotFound for one that does not exist', async () => {
    expect((await s3.send(new HeadBucketCommand({ Bucket }))).$metadata.httpStatusCode).toBe(200);
    await expect(s3.send(new HeadBucketCommand({ Bucket: `missing-${randomUUID()}` }))).rejects.toMatchObject({
      $metadata: { httpStatusCode: 404 },
    });
  });
});

describe('object store: plain objects', () => {
  it('gives back exactly what was put, with the md5 as ETag', async () => {
    const Key = `${prefix}/round-trip.bin`;
    createdKeys.push(Key);
    const body = randomBytes(300 * 1024);
    const put = await s3.send(new PutObjectCommand({ Bucket, Key, Body: body, ContentType: 'application/octet-stream' }));
    expect(put.ETag).toBe(quoted(md5(body)));

    const got = await readObject(Key);
    expect(got.length).toBe(body.length);
    expect(got.equals(body)).toBe(true);
  });
});

describe('object store: multipart upload with ListParts', () => {
  // S3 requires 5 MiB for every part but the last.
  const parts = [randomBytes(5 * MiB), randomBytes(5 * MiB), randomBytes(MiB + 123)];
  let upload: { Key: string; UploadId: string };

  beforeAll(async () => {
    upload = await startUpload('three-parts.mp4');
    for (const [i, Body] of parts.entries()) {
      const out = await s3.send(new UploadPartCommand({ Bucket, ...upload, PartNumber: i + 1, Body }));
      expect(out.ETag).toBe(quoted(md5(Body)));
    }
  });

  it('lists the three stored parts with their ETags and sizes', async () => {
    const listed = await s3.send(new ListPartsCommand({ Bucket, ...upload }));
    expect(listed.UploadId).toBe(upload.UploadId);
    expect(listed.Key).toBe(upload.Key);
    expect(listed.IsTruncated).toBe(false);
    expect(listed.Parts?.map((p) => ({ PartNumber: p.PartNumber, ETag: p.ETag, Size: p.Size }))).toEqual(
      parts.map((body, i) => ({ PartNumber: i + 1, ETag: quoted(md5(body)), Size: body.length })),
    );
    for (const part of listed.Parts ?? []) {
      expect(part.LastModified).toBeInstanceOf(Date);
      expect(Math.abs(Date.now() - part.LastModified!.getTime())).toBeLessThan(10 * 60_000);
    }
  });

  it('pages with MaxParts and PartNumberMarker', async () => {
    const first = await s3.send(new ListPartsCommand({ Bucket, ...upload, MaxParts: 2 }));
    expect(first.Parts?.map((p) => p.PartNumber)).toEqual([1, 2]);
    expect(first.MaxParts).toBe(2);
    expect(first.IsTruncated).toBe(true);
    expect(first.NextPartNumberMarker).toBe('2');

    const second = await s3.send(
      new ListPartsCommand({ Bucket, ...upload, MaxParts: 2, PartNumberMarker: first.NextPartNumberMarker }),
    );
    expect(second.Parts?.map((p) => p.PartNumber)).toEqual([3]);
    expect(second.IsTruncated).toBe(false);

    const past = await s3.send(new ListPartsCommand({ Bucket, ...upload, PartNumberMarker: '3' }));
    expect(past.Parts ?? []).toEqual([]);
    expect(past.IsTruncated).toBe(false);
  });

  it('does not show an upload under another key', async () => {
    await expect(
      s3.send(new ListPartsCommand({ Bucket, Key: `${prefix}/some-other-key.mp4`, UploadId: upload.UploadId })),
    ).rejects.toMatchObject(noSuchUpload);
  });

  it('completes from the listed parts into the concatenation, then the upload is gone', async () => {
    // As a resumed upload does: the part list comes from the store, not from memory.
    const listed = await s3.send(new ListPartsCommand({ Bucket, ...upload }));
    const done = await s3.send(
      new CompleteMultipartUploadCommand({
        Bucket,
        ...upload,
        MultipartUpload: { Parts: listed.Parts!.map(({ PartNumber, ETag }) => ({ PartNumber, ETag })) },
      }),
    );
    createdKeys.push(upload.Key);
    expect(done.Key).toBe(upload.Key);

    const got = await readObject(upload.Key);
    const expected = Buffer.concat(parts);
    expect(got.length).toBe(expected.length);
    expect(md5(got)).toBe(md5(expected));

    await expect(s3.send(new ListPartsCommand({ Bucket, ...upload }))).rejects.toMatchObject(noSuchUpload);
  });

  it("gives the assembled object S3's multipart ETag and length", async () => {
    const head = await s3.send(new HeadObjectCommand({ Bucket, Key: upload.Key }));
    // S3's multipart ETag: md5 of the concatenated binary part md5s, a dash, the part count
    // (AWS S3 user guide, "Checking object integrity": multipart ETags are not the object's md5).
    const partMd5s = Buffer.concat(parts.map((p) => createHash('md5').update(p).digest()));
    expect(head.ETag).toBe(quoted(`${md5(partMd5s)}-3`));
    expect(head.ContentLength).toBe(parts.reduce((n, p) => n + p.length, 0));
  });

  it('serves byte ranges that cross part boundaries (RFC 9110 §14)', async () => {
    const whole = Buffer.concat(parts);
    const ranges: [number, number][] = [
      [0, 0],
      [5 * MiB - 10, 5 * MiB + 9], // end of part 1, start of part 2
      [5 * MiB - 1, 10 * MiB], // last byte of part 1, all of part 2, first byte of part 3
      [whole.length - 50, whole.length - 1],
    ];
    for (const [start, end] of ranges) {
      const out = await s3.send(new GetObjectCommand({ Bucket, Key: upload.Key, Range: `bytes=${start}-${end}` }));
      expect(out.$metadata.httpStatusCode).toBe(206);
      expect(out.ContentRange).toBe(`bytes ${start}-${end}/${whole.length}`);
      const got = Buffer.from(await out.Body!.transformToByteArray());
      expect(got.equals(whole.subarray(start, end + 1))).toBe(true);
    }
  });

  it('replaces an assembled object with a plain put, and deletes it', async () => {
    const body = randomBytes(1000);
    await s3.send(new PutObjectCommand({ Bucket, Key: upload.Key, Body: body }));
    expect((await readObject(upload.Key)).equals(body)).toBe(true);
    await s3.send(new DeleteObjectCommand({ Bucket, Key: upload.Key }));
    await expect(readObject(upload.Key)).rejects.toMatchObject({ name: 'NoSuchKey' });
  });
});

describe('object store: completing checks the parts named', () => {
  it('refuses a part whose ETag does not match, or that was never uploaded, and keeps the upload', async () => {
    const upload = await startUpload('checked.mp4');
    const body = randomBytes(64 * 1024);
    const part = await s3.send(new UploadPartCommand({ Bucket, ...upload, PartNumber: 1, Body: body }));
    const complete = (Parts: { PartNumber: number; ETag: string }[]) =>
      s3.send(new CompleteMultipartUploadCommand({ Bucket, ...upload, MultipartUpload: { Parts } }));

    const invalidPart = { name: 'InvalidPart', $metadata: { httpStatusCode: 400 } };
    await expect(complete([{ PartNumber: 1, ETag: quoted(md5(randomBytes(8))) }])).rejects.toMatchObject(invalidPart);
    await expect(complete([{ PartNumber: 1, ETag: part.ETag! }, { PartNumber: 2, ETag: part.ETag! }])).rejects.toMatchObject(
      invalidPart,
    );
    // Nothing was lost: the stored part is still listed and the upload completes with it.
    const listed = await s3.send(new ListPartsCommand({ Bucket, ...upload }));
    expect(listed.Parts?.map((p) => p.PartNumber)).toEqual([1]);
    await complete([{ PartNumber: 1, ETag: part.ETag! }]);
    createdKeys.push(upload.Key);
    expect((await readObject(upload.Key)).equals(body)).toBe(true);
  });
});

describe('object store: AbortMultipartUpload', () => {
  it('removes the stored parts; listing, uploading, completing and aborting again then fail', async () => {
    const upload = await startUpload('abandoned.mp4');
    const body = randomBytes(64 * 1024);
    const part = await s3.send(new UploadPartCommand({ Bucket, ...upload, PartNumber: 1, Body: body }));
    const before = await s3.send(new ListPartsCommand({ Bucket, ...upload }));
    expect(before.Parts?.map((p) => p.PartNumber)).toEqual([1]);

    const aborted = await s3.send(new AbortMultipartUploadCommand({ Bucket, ...upload }));
    expect(aborted.$metadata.httpStatusCode).toBe(204);

    await expect(s3.send(new ListPartsCommand({ Bucket, ...upload }))).rejects.toMatchObject(noSuchUpload);
    await expect(
      s3.send(
        new CompleteMultipartUploadCommand({
          Bucket,
          ...upload,
          MultipartUpload: { Parts: [{ PartNumber: 1, ETag: part.ETag }] },
        }),
      ),
    ).rejects.toMatchObject(noSuchUpload);
    await expect(
      s3.send(new UploadPartCommand({ Bucket, ...upload, PartNumber: 2, Body: body })),
    ).rejects.toMatchObject(noSuchUpload);
    await expect(s3.send(new AbortMultipartUploadCommand({ Bucket, ...upload }))).rejects.toMatchObject(noSuchUpload);
    // Nothing was assembled from the aborted parts.
    await expect(readObject(upload.Key)).rejects.toMatchObject({ name: 'NoSuchKey' });
  });

  it('answers NoSuchUpload for an upload id it never issued', async () => {
    const Key = `${prefix}/never-started.mp4`;
    const UploadId = randomBytes(16).toString('hex');
    await expect(s3.send(new ListPartsCommand({ Bucket, Key, UploadId }))).rejects.toMatchObject(noSuchUpload);
    await expect(s3.send(new AbortMultipartUploadCommand({ Bucket, Key, UploadId }))).rejects.toMatchObject(
      noSuchUpload,
    );
  });
});

describe('object store: browser access (CORS and presigned URLs)', () => {
  it.each(['PUT', 'GET', 'POST', 'DELETE'])('allows a %s preflight from the app origin', async (method) => {
    const res = await fetch(`${endpoint}/${Bucket}/${prefix}/preflight.mp4?uploadId=abc&partNumber=1`, {
      method: 'OPTIONS',
      headers: {
        Origin: appOrigin,
        'Access-Control-Request-Method': method,
        'Access-Control-Request-Headers': 'content-type,x-amz-date',
      },
    });
    expect(res.status).toBe(200);
    expect(['*', appOrigin]).toContain(res.headers.get('access-control-allow-origin'));
    expect(res.headers.get('access-control-allow-methods')?.split(/,\s*/)).toContain(method);
    expect(res.headers.get('access-control-allow-headers')?.toLowerCase()).toContain('content-type');
  });

  it('uploads a part to a presigned URL, exposing ETag; lists and aborts through presigned URLs', async () => {
    const upload = await startUpload('from-browser.mp4');
    const body = randomBytes(200 * 1024);

    const partUrl = await getSignedUrl(s3, new UploadPartCommand({ Bucket, ...upload, PartNumber: 1 }), {
      expiresIn: 300,
    });
    const put = await fetch(partUrl, { method: 'PUT', body, headers: { Origin: appOrigin } });
    expect(put.status).toBe(200);
    expect(put.headers.get('etag')).toBe(quoted(md5(body)));
    const exposed = (put.headers.get('access-control-expose-headers') ?? '').split(/,\s*/).map((h) => h.toLowerCase());
    expect(exposed).toContain('etag');

    // Resume after a reload: the browser lists the parts through a presigned GET.
    const listUrl = await getSignedUrl(s3, new ListPartsCommand({ Bucket, ...upload }), { expiresIn: 300 });
    const list = await fetch(listUrl, { headers: { Origin: appOrigin } });
    expect(list.status).toBe(200);
    expect(list.headers.get('access-control-allow-origin')).toBeTruthy();
    const xml = await list.text();
    expect(xml).toContain('<ListPartsResult');
    expect(xml).toContain('<PartNumber>1</PartNumber>');
    expect(xml).toContain(`<Size>${body.length}</Size>`);

    // Cancel: the browser aborts through a presigned DELETE; the error after it keeps CORS headers.
    const abortUrl = await getSignedUrl(s3, new AbortMultipartUploadCommand({ Bucket, ...upload }), { expiresIn: 300 });
    const aborted = await fetch(abortUrl, { method: 'DELETE', headers: { Origin: appOrigin } });
    expect(aborted.status).toBe(204);
    expect(aborted.headers.get('access-control-allow-origin')).toBeTruthy();
    const again = await fetch(abortUrl, { method: 'DELETE', headers: { Origin: appOrigin } });
    expect(again.status).toBe(404);
    expect(again.headers.get('access-control-allow-origin')).toBeTruthy();
    expect(await again.text()).toContain('<Code>NoSuchUpload</Code>');
  });
});
