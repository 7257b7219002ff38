// s3rver's filesystem store, except that CompleteMultipartUpload does not copy the parts into
// one new file: the upload's folder is moved aside and the object becomes a list of its parts,
// read in order (with ranges across part boundaries). S3 assembles without copying too, so
// completing a 1 GiB upload takes milliseconds here instead of re-writing a gigabyte.
// The ETag of such an object is S3's multipart form: md5 of the parts' binary md5s, "-N".
import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import fs from 'node:fs/promises';
import path from 'node:path';
import { Readable } from 'node:stream';
import { createRequire } from 'node:module';

const require = createRequire(import.meta.url);
const FilesystemStore = require('s3rver/lib/stores/filesystem');
const S3Object = require('s3rver/lib/models/object');
const S3Error = require('s3rver/lib/models/error');

const isMissing = (err) => err.code === 'ENOENT' || err.code === 'ENOTDIR';

async function readJson(file) {
  try {
    return JSON.parse(await fs.readFile(file, 'utf8'));
  } catch (err) {
    if (isMissing(err)) return null;
    throw err;
  }
}

/** Bytes start..end (inclusive) of the files laid end to end. */
async function* readAcross(files, start, end) {
  let offset = 0;
  for (const file of files) {
    const first = offset;
    const last = offset + file.size - 1;
    offset += file.size;
    if (last < start || first > end || file.size === 0) continue;
    const stream = createReadStream(file.path, {
      start: Math.max(start, first) - first,
      end: Math.min(end, last) - first,
      highWaterMark: 1024 * 1024,
    });
    for await (const chunk of stream) yield chunk;
  }
}

export class PartsAwareStore extends FilesystemStore {
  manifestPath(bucket, key) {
    return this.getResourcePath(bucket, key, 'parts.json');
  }

  /** Where completed uploads' folders go: <bucket>/._S3rver_assembled/<uploadId>. */
  assembledDir(bucket, uploadId) {
    return path.join(this.getResourcePath(bucket, undefined, 'assembled'), uploadId);
  }

  async readManifest(bucket, key) {
    const manifest = await readJson(this.manifestPath(bucket, key));
    if (!manifest) return null;
    const dir = this.assembledDir(bucket, manifest.uploadId);
    return { ...manifest, files: manifest.parts.map((p) => ({ path: path.join(dir, String(p.number)), size: p.size })) };
  }

  async dropManifest(bucket, key) {
    const manifest = await readJson(this.manifestPath(bucket, key));
    if (!manifest) return;
    await fs.rm(this.manifestPath(bucket, key), { force: true });
    await fs.rm(this.assembledDir(bucket, manifest.uploadId), { recursive: true, force: true });
  }

  async getMetadata(bucket, key) {
    const manifest = await this.readManifest(bucket, key);
    if (!manifest) return super.getMetadata(bucket, key);
    const metadata = await super.getMetadata(bucket, key); // the empty placeholder's metadata
    return { ...metadata, 'content-length': manifest.size };
  }

  async getObject(bucket, key, options) {
    const manifest = await this.readManifest(bucket, key);
    if (!manifest) return super.getObject(bucket, key, options);
    const metadata = await this.getMetadata(bucket, key);
    const lastByte = Math.max(0, manifest.size - 1);
    const range = {
      start: (options && options.start) || 0,
      // "bytes=0-0" asks for one byte (s3rver's own read takes an end of 0 as "to the end").
      end: Math.min(options && options.end !== undefined ? options.end : Infinity, lastByte),
    };
    const ranged = options && (options.start !== undefined || options.end !== undefined);
    const satisfiable = range.start >= 0 && range.start <= range.end;
    const content = satisfiable
      ? Readable.from(readAcross(manifest.files, range.start, range.end), { objectMode: false })
      : null;
    const object = new S3Object(bucket, key, content, metadata);
    if (ranged) object.range = range;
    return object;
  }

  async putObject(object) {
    const result = await super.putObject(object);
    await this.dropManifest(object.bucket, object.key);
    return result;
  }

  async copyObject(srcBucket, srcKey, destBucket, destKey, replacementMetadata) {
    const manifest = await this.readManifest(srcBucket, srcKey);
    if (!manifest) return super.copyObject(srcBucket, srcKey, destBucket, destKey, replacementMetadata);
    const source = await this.getObject(srcBucket, srcKey);
    const metadata = replacementMetadata ?? source.metadata;
    await this.putObject(new S3Object(destBucket, destKey, source.content, metadata));
    return this.getMetadata(destBucket, destKey);
  }

  async deleteObject(bucket, key) {
    await this.dropManifest(bucket, key);
    return super.deleteObject(bucket, key);
  }

  async putObjectMultipart(bucket, uploadId, parts) {
    const uploadDir = path.join(this.getResourcePath(bucket, undefined, 'uploads'), uploadId);
    const [key, metadata] = await Promise.all([
      fs.readFile(path.join(uploadDir, 'key'), 'utf8'),
      fs.readFile(path.join(uploadDir, 'metadata'), 'utf8').then(JSON.parse),
    ]);
    // As S3: parts in ascending order, each one stored with the ETag the client names.
    const stored = [];
    for (const [i, part] of parts.entries()) {
      if (i > 0 && part.number <= parts[i - 1].number) {
        throw new S3Error('InvalidPartOrder', 'The list of parts was not in ascending order.', { UploadId: uploadId });
      }
      const file = path.join(uploadDir, String(part.number));
      const [stat, md5] = await Promise.all([fs.stat(file), fs.readFile(`${file}.md5`, 'utf8')]).catch((err) => {
        if (isMissing(err)) return [null, null];
        throw err;
      });
      if (!stat || md5.trim() !== part.etag) {
        throw new S3Error(
          'InvalidPart',
          "One or more of the specified parts could not be found. The part may not have been uploaded, or the specified entity tag may not match the part's entity tag.",
          { UploadId: uploadId, PartNumber: part.number, ETag: part.etag },
        );
      }
      stored.push({ number: part.number, size: stat.size, md5: md5.trim() });
    }
    const etag = `${createHash('md5')
      .update(Buffer.concat(stored.map((p) => Buffer.from(p.md5, 'hex'))))
      .digest('hex')}-${stored.length}`;
    const size = stored.reduce((sum, p) => sum + p.size, 0);

    // Any earlier version of the key goes first; then the parts move in one rename.
    await this.dropManifest(bucket, key);
    const assembled = this.assembledDir(bucket, uploadId);
    await fs.mkdir(path.dirname(assembled), { recursive: true });
    await fs.rename(uploadDir, assembled);
    await fs.mkdir(path.dirname(this.manifestPath(bucket, key)), { recursive: true });
    await fs.writeFile(
      this.manifestPath(bucket, key),
      JSON.stringify({ uploadId, size, parts: stored.map(({ number, size: bytes }) => ({ number, size: bytes })) }),
    );
    // An empty placeholder keeps s3rver's existence checks and listings working.
    await super.putObject(new S3Object(bucket, key, Buffer.alloc(0), metadata));
    await this.putMetadata(bucket, key, metadata, etag);
    return { md5: etag, size };
  }
}
