import { and, eq } from 'drizzle-orm';
import { GetObjectCommand, HeadObjectCommand, type S3Client } from '@aws-sdk/client-s3';
import parseRange from 'range-parser';
import { lessons, recordings } from '~/db/schema';
import { AppError, notFound } from '../errors';
import type { AppDeps } from '../app';
import type { StudioAccess } from './accounts';
import { recordingPrefix } from './recordings';
import { hasEntitlement } from './entitlement';

/** Files a recording's media folder may hold; anything else is not found. */
const MEDIA_PATH =
  /^(poster\.jpg|peaks\.bin|hls\/master\.m3u8|hls\/v\d{1,2}\/(index\.m3u8|seg_\d{1,6}\.ts)|chapters\/[0-9a-f-]{36}\/\d{1,4}\.jpg)$/;

const CONTENT_TYPES: [RegExp, string][] = [
  [/\.m3u8$/, 'application/vnd.apple.mpegurl'],
  [/\.ts$/, 'video/mp2t'],
  [/\.jpg$/, 'image/jpeg'],
  [/\.bin$/, 'application/octet-stream'],
];

/** Still pictures that show what a class is (library cards, chapter list): browsing, not watching. */
const PREVIEW_PATH = /^(poster\.jpg|chapters\/[0-9a-f-]{36}\/\d{1,4}\.jpg)$/;

/**
 * Whether a person may fetch a recording's media: staff of its studio always; members only the
 * current recording of a published class of their studio, and the video itself only while their
 * membership entitles them to watch (its pictures also without, so they can browse). Anything
 * else looks "not found".
 */
export async function mediaKeyFor(
  deps: AppDeps,
  studio: StudioAccess | null,
  recordingId: string,
  path: string,
  userId?: string,
): Promise<{ key: string; contentType: string }> {
  if (!studio || !MEDIA_PATH.test(path) || !/^[0-9a-f-]{36}$/i.test(recordingId)) throw notFound('That file');
  const [row] = await deps.db
    .select({ rec: recordings, lessonState: lessons.state, current: lessons.currentRecordingId })
    .from(recordings)
    .innerJoin(lessons, eq(lessons.id, recordings.lessonId))
    .where(and(eq(recordings.id, recordingId), eq(recordings.studioId, studio.studioId), eq(recordings.state, 'ready')));
  if (!row) throw notFound('That file');
  const staff = studio.roles.some((r) => r !== 'member');
  if (!staff && !(row.lessonState === 'published' && row.current === recordingId)) throw notFound('That file');
  if (!staff && !PREVIEW_PATH.test(path) && !(userId && (await hasEntitlement(deps, studio.studioId, userId)))) {
    throw notFound('That file');
  }
  return {
    key: `${recordingPrefix(row.rec)}media/${path}`,
    contentType: CONTENT_TYPES.find(([re]) => re.test(path))?.[1] ?? 'application/octet-stream',
  };
}

/** Streams an object from storage, passing a Range request through (players seek with it). */
/**
 * The one byte range to ask the store for, or undefined for the whole object. Parsed with
 * range-parser (the parser Express's `send` uses) against the object's size, because the local
 * store answers some malformed or suffix ranges wrongly. RFC 9110 §14.2 lets a server ignore a
 * Range it cannot or will not honour (malformed, another unit, several ranges): those get the
 * whole object. A range starting past the end answers 416 with `Content-Range: bytes *\/size` (§15.5.17).
 */
async function storeRange(s3: S3Client, bucket: string, key: string, header: string | null): Promise<string | undefined> {
  if (!header) return undefined;
  const head = await s3.send(new HeadObjectCommand({ Bucket: bucket, Key: key }));
  const size = head.ContentLength ?? 0;
  const parsed = parseRange(size, header, { combine: true });
  if (parsed === -1) {
    throw new AppError('range_not_satisfiable', `That byte range is outside the file (${size} bytes).`, undefined, { size });
  }
  if (parsed === -2 || parsed.type !== 'bytes' || parsed.length !== 1) return undefined;
  return `bytes=${parsed[0]!.start}-${parsed[0]!.end}`;
}

export async function streamObject(s3: S3Client, bucket: string, key: string, contentType: string, range: string | null): Promise<Response> {
  try {
    const Range = await storeRange(s3, bucket, key, range);
    const obj = await s3.send(new GetObjectCommand({ Bucket: bucket, Key: key, ...(Range ? { Range } : {}) }));
    const headers = new Headers({
      'content-type': contentType,
      'accept-ranges': 'bytes',
      // Playlists and segments of a ready recording never change; the URL carries no secret.
      'cache-control': 'private, max-age=3600',
    });
    if (obj.ContentLength != null) headers.set('content-length', String(obj.ContentLength));
    if (obj.ContentRange) headers.set('content-range', obj.ContentRange);
    if (obj.ETag) headers.set('etag', obj.ETag);
    return new Response(obj.Body!.transformToWebStream(), { status: obj.ContentRange ? 206 : 200, headers });
  } catch (err) {
    const name = (err as { name?: string }).name;
    if (name === 'NoSuchKey' || name === 'NotFound') throw notFound('That file');
    throw err;
  }
}
