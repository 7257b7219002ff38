import { createReadStream, createWriteStream } from 'node:fs';
import { mkdir, readdir, rm, stat } from 'node:fs/promises';
import { join, relative } from 'node:path';
import { pipeline } from 'node:stream/promises';
import type { Readable } from 'node:stream';
import { GetObjectCommand, PutObjectCommand, type S3Client } from '@aws-sdk/client-s3';

/** Local scratch folder of one recording inside the worker's work dir. */
export const recordingDir = (workDir: string, recordingId: string) => join(workDir, recordingId);

/** Downloads the source once per worker; a complete earlier download (same size) is reused. */
export async function ensureSource(
  s3: S3Client,
  bucket: string,
  key: string,
  path: string,
  expectedBytes: number,
  signal: AbortSignal,
): Promise<void> {
  const existing = await stat(path).catch(() => null);
  if (existing && existing.size === expectedBytes) return;
  await mkdir(join(path, '..'), { recursive: true });
  const obj = await s3.send(new GetObjectCommand({ Bucket: bucket, Key: key }), { abortSignal: signal });
  await pipeline(obj.Body as Readable, createWriteStream(path), { signal });
}

const CONTENT_TYPES: Record<string, string> = {
  m3u8: 'application/vnd.apple.mpegurl',
  ts: 'video/mp2t',
  jpg: 'image/jpeg',
  bin: 'application/octet-stream',
};

/** Every file below a folder, as paths relative to it. */
export async function listFiles(dir: string): Promise<string[]> {
  const entries = await readdir(dir, { recursive: true, withFileTypes: true });
  return entries.filter((e) => e.isFile()).map((e) => relative(dir, join(e.parentPath, e.name)));
}

/**
 * Uploads a folder under a prefix. Keys are derived from file names only, so a retried job
 * overwrites the same objects instead of adding a second set.
 */
export async function uploadFolder(s3: S3Client, bucket: string, dir: string, prefix: string, signal: AbortSignal): Promise<string[]> {
  const files = await listFiles(dir);
  const queue = [...files];
  const workers = Array.from({ length: 4 }, async () => {
    for (let file = queue.shift(); file; file = queue.shift()) {
      const size = (await stat(join(dir, file))).size;
      await s3.send(
        new PutObjectCommand({
          Bucket: bucket,
          Key: prefix + file.split('\\').join('/'),
          Body: createReadStream(join(dir, file)),
          ContentLength: size,
          ContentType: CONTENT_TYPES[file.split('.').pop() ?? ''] ?? 'application/octet-stream',
        }),
        { abortSignal: signal },
      );
    }
  });
  await Promise.all(workers);
  return files;
}

/** Removes a recording's scratch folder. */
export const cleanScratch = (dir: string) => rm(dir, { recursive: true, force: true });
