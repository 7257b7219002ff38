/**
 * Upload throughput: 1 GiB through presigned multipart requests (as the browser widget sends
 * them, 4 parts in flight) vs one direct SDK PutObject of the same file to the same store, in
 * the same run. Target ratio (multipart / direct throughput) ≥ 0.8. Run: npm run bench.
 */
import { createReadStream } from 'node:fs';
import http from 'node:http';
import { mkdtemp, open, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import {
  CompleteMultipartUploadCommand,
  CreateMultipartUploadCommand,
  DeleteObjectCommand,
  PutObjectCommand,
  UploadPartCommand,
} from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import { createS3, storageConfigFromEnv } from '~/server/storage';

const SIZE = Number(process.env.BENCH_UPLOAD_BYTES ?? 1024 ** 3);
const PART = 16 * 1024 * 1024;
const IN_FLIGHT = 4;
const config = storageConfigFromEnv();
const s3 = createS3(config);
const Bucket = config.bucket;

const dir = await mkdtemp(join(tmpdir(), 'roundmark-bench-'));
const file = join(dir, 'upload.bin');
// Random-ish content so no layer can shortcut it; written once, read by both runs.
const chunk = new Uint8Array(PART);
for (let i = 0; i < chunk.length; i += 4) new DataView(chunk.buffer).setUint32(i, (i * 2654435761) >>> 0);
await writeFile(file, new Uint8Array(0));
{
  const fh = await open(file, 'w');
  for (let at = 0; at < SIZE; at += PART) await fh.write(chunk, 0, Math.min(PART, SIZE - at));
  await fh.close();
}

async function direct(): Promise<number> {
  const t = performance.now();
  await s3.send(new PutObjectCommand({ Bucket, Key: 'bench/direct.bin', Body: createReadStream(file), ContentLength: SIZE }));
  return performance.now() - t;
}

// The presigned requests go through node:http, the same HTTP stack the SDK uses for the
// baseline, so the ratio compares the upload schemes rather than two HTTP clients (Node's
// fetch sends large bodies markedly slower here).
const agent = new http.Agent({ keepAlive: true, maxSockets: IN_FLIGHT });
function request(url: string, method: string, body?: Uint8Array): Promise<{ status: number; etag: string; text: string }> {
  return new Promise((resolve, reject) => {
    const req = http.request(url, { method, agent, headers: { 'content-length': body?.length ?? 0 } }, (res) => {
      let text = '';
      res.setEncoding('utf8');
      res.on('data', (chunk: string) => (text += chunk));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, etag: String(res.headers.etag ?? ''), text }));
    });
    req.on('error', reject);
    req.end(body);
  });
}

async function signedMultipart(): Promise<number> {
  const t = performance.now();
  const Key = 'bench/multipart.bin';
  const create = await request(await getSignedUrl(s3, new CreateMultipartUploadCommand({ Bucket, Key })), 'POST');
  const UploadId = create.text.match(/<UploadId>([^<]+)<\/UploadId>/)![1]!;
  const fh = await open(file, 'r');
  const parts: { PartNumber: number; ETag: string }[] = [];
  const numbers = Array.from({ length: Math.ceil(SIZE / PART) }, (_, i) => i + 1);
  await Promise.all(
    Array.from({ length: IN_FLIGHT }, async () => {
      // One buffer per request in flight, reused (as the browser slices the file instead of copying it).
      const part = new Uint8Array(PART);
      for (let n = numbers.shift(); n; n = numbers.shift()) {
        const len = Math.min(PART, SIZE - (n - 1) * PART);
        const buf = part.subarray(0, len);
        await fh.read(buf, 0, len, (n - 1) * PART);
        const url = await getSignedUrl(s3, new UploadPartCommand({ Bucket, Key, UploadId, PartNumber: n }));
        const res = await request(url, 'PUT', buf);
        if (res.status !== 200) throw new Error(`part ${n}: HTTP ${res.status} ${res.text}`);
        parts.push({ PartNumber: n, ETag: res.etag });
      }
    }),
  );
  await fh.close();
  parts.sort((a, b) => a.PartNumber - b.PartNumber);
  const partsDone = performance.now();
  await s3.send(new CompleteMultipartUploadCommand({ Bucket, Key, UploadId, MultipartUpload: { Parts: parts } }));
  const end = performance.now();
  console.log(`    multipart: parts ${((partsDone - t) / 1000).toFixed(2)} s, complete ${((end - partsDone) / 1000).toFixed(2)} s`);
  return end - t;
}

const mib = SIZE / 1024 / 1024;
const runs: { direct: number; multipart: number }[] = [];
for (let round = 0; round < 2; round++) {
  // Alternate the order so disk caches favour neither.
  const a = round % 2 === 0 ? await direct() : await signedMultipart();
  const b = round % 2 === 0 ? await signedMultipart() : await direct();
  runs.push(round % 2 === 0 ? { direct: a, multipart: b } : { direct: b, multipart: a });
}
const best = (k: 'direct' | 'multipart') => Math.min(...runs.map((r) => r[k]));
const mbps = (ms: number) => mib / (ms / 1000);
console.log(`upload ${mib} MiB to the local store, best of ${runs.length}:`);
console.log(`  direct SDK PutObject (baseline): ${(best('direct') / 1000).toFixed(2)} s, ${mbps(best('direct')).toFixed(1)} MiB/s`);
console.log(`  presigned multipart, ${IN_FLIGHT} parts of ${PART / 1024 / 1024} MiB in flight: ${(best('multipart') / 1000).toFixed(2)} s, ${mbps(best('multipart')).toFixed(1)} MiB/s`);
console.log(`  throughput ratio multipart/direct: ${(best('direct') / best('multipart')).toFixed(2)} (target >= 0.8)`);
await s3.send(new DeleteObjectCommand({ Bucket, Key: 'bench/direct.bin' }));
await s3.send(new DeleteObjectCommand({ Bucket, Key: 'bench/multipart.bin' }));
await rm(dir, { recursive: true, force: true });
agent.destroy();
