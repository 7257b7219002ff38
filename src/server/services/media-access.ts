import { and, eq } from 'drizzle-orm';
import { GetObjectCommand, HeadObjectCommand, type S3Client } from '@aws-sdk/client-s3';
import parseRange from 'range-parser';
import { lessons, recordings } from '~/db/schema';
import { isMasterPlaylist, playlistUris, rewritePlaylist } from '~/lib/media/playlist-rewrite';
import { AppError, notFound } from '../errors';
import type { AppDeps } from '../app';
import { ACCESS_CHANNEL, notifyLibraryChanged } from '../library-cache';
import { mediaLinkSeconds, signedMediaUrl } from '../media/media-urls';
import type { StudioAccess } from './accounts';
import { recordingPrefix } from './recordings';
import { hasEntitlement } from './entitlement';

/** Files a recording's media folder may hold; anything else is not found. */
const MEDIA_PATH =
  /^(poster\.jpg|peaks\.bin|hls\/master\.m3u8|hls\/v\d{1,2}\/(index\.m3u8|seg_\d{1,6}\.ts)|chapters\/[0-9a-f-]{36}\/\d{1,4}\.jpg|cover\/[0-9a-f-]{36}\.jpg)$/;

/** Playlists are answered by the app (rewritten); every other file is fetched from storage directly. */
const PLAYLIST_PATH = /^hls\/(master|v\d{1,2}\/index)\.m3u8$/;

const CONTENT_TYPES: [RegExp, string][] = [
  [/\.m3u8$/, 'application/vnd.apple.mpegurl'],
  [/\.ts$/, 'video/mp2t'],
  [/\.jpg$/, 'image/jpeg'],
  [/\.bin$/, 'application/octet-stream'],
];

/** Still pictures that show what a class is (library cards, chapter list): browsing, not watching. */
const PREVIEW_PATH = /^(poster\.jpg|chapters\/[0-9a-f-]{36}\/\d{1,4}\.jpg|cover\/[0-9a-f-]{36}\.jpg)$/;

/** What decides whether one person may fetch one recording's files. */
interface AccessFacts {
  prefix: string;
  durationSeconds: number | null;
  /** May see the pictures (staff, or a member of the studio for the current recording of a published class). */
  mayBrowse: boolean;
  /** May also play the video. */
  mayWatch: boolean;
}

/**
 * Whether a person may fetch a recording's media: staff of its studio always; members only the
 * current recording of a published class of their studio, and the video itself only while their
 * membership entitles them to watch (its pictures also without, so they can browse). Anything
 * else looks "not found". The answer is shared for 30 s per person and recording and dropped as
 * soon as any process announces an access change in the studio (`accessChanged`).
 */
async function accessFacts(deps: AppDeps, studio: StudioAccess, recordingId: string, userId: string): Promise<AccessFacts> {
  const load = async (): Promise<AccessFacts> => {
    const [row] = await deps.db
      .select({ rec: recordings, lessonState: lessons.state, current: lessons.currentRecordingId })
      .from(recordings)
      .innerJoin(lessons, eq(lessons.id, recordings.lessonId))
      .where(and(eq(recordings.id, recordingId), eq(recordings.studioId, studio.studioId), eq(recordings.state, 'ready')));
    if (!row) return { prefix: '', durationSeconds: null, mayBrowse: false, mayWatch: false };
    const staff = studio.roles.some((r) => r !== 'member');
    const mayBrowse = staff || (row.lessonState === 'published' && row.current === recordingId);
    const mayWatch = mayBrowse && (staff || (await hasEntitlement(deps, studio.studioId, userId)));
    return { prefix: recordingPrefix(row.rec), durationSeconds: row.rec.durationSeconds, mayBrowse, mayWatch };
  };
  return deps.accessCache ? deps.accessCache.get(studio.studioId, `${userId}|${recordingId}`, load) : load();
}

/** What the media route answers: a playlist's text, where to fetch the bytes from, or a byte range it serves itself. */
export type MediaAnswer =
  | { kind: 'playlist'; body: string }
  | { kind: 'redirect'; url: string }
  | { kind: 'range'; response: Response };

/**
 * One media request: checks access once, then either returns a playlist whose every media link
 * is a short-lived signed storage URL (so members' players fetch segments straight from storage,
 * never through the app), or a signed URL to redirect a single file request to.
 */
export async function mediaAnswer(
  deps: AppDeps,
  storage: { s3: S3Client; bucket: string },
  studio: StudioAccess | null,
  recordingId: string,
  path: string,
  userId: string,
  range: string | null = null,
): Promise<MediaAnswer> {
  if (!studio || !MEDIA_PATH.test(path) || !/^[0-9a-f-]{36}$/i.test(recordingId)) throw notFound('That file');
  const facts = await accessFacts(deps, studio, recordingId, userId);
  const allowed = PREVIEW_PATH.test(path) ? facts.mayBrowse : facts.mayWatch;
  if (!allowed) throw notFound('That file');
  const expiresIn = mediaLinkSeconds(facts.durationSeconds);
  const key = `${facts.prefix}media/${path}`;
  if (!PLAYLIST_PATH.test(path)) {
    // HLS players never send Range (segments are whole files); a ranged request for a single file
    // is answered here, where ranges are checked as RFC 9110 says (the local store reads some wrongly).
    if (range) return { kind: 'range', response: await streamObject(storage.s3, storage.bucket, key, contentTypeOf(path), range) };
    return { kind: 'redirect', url: await signedMediaUrl(storage.s3, storage.bucket, key, expiresIn) };
  }

  const text = await readText(storage.s3, storage.bucket, key);
  // A master playlist names the variant playlists: they stay on the app (relative links), so
  // each is rewritten on request too. A media playlist names the segments: each gets a signed link.
  if (isMasterPlaylist(text)) return { kind: 'playlist', body: text };
  const folder = key.slice(0, key.lastIndexOf('/') + 1);
  const links = new Map(
    await Promise.all(
      playlistUris(text)
        .filter((uri) => /^[\w.-]+$/.test(uri)) // only files beside the playlist; never a path out of the folder
        .map(async (uri) => [uri, await signedMediaUrl(storage.s3, storage.bucket, folder + uri, expiresIn)] as const),
    ),
  );
  return { kind: 'playlist', body: rewritePlaylist(text, links) };
}

async function readText(s3: S3Client, bucket: string, key: string): Promise<string> {
  try {
    const obj = await s3.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
    return await obj.Body!.transformToString('utf8');
  } catch (err) {
    if ((err as { name?: string }).name === 'NoSuchKey') throw notFound('That file');
    throw err;
  }
}

/** Tells every process that who may watch in a studio changed (membership or subscription). */
export async function accessChanged(deps: AppDeps, studioId: string): Promise<void> {
  deps.accessCache?.forget(studioId);
  await notifyLibraryChanged(deps.pool, studioId, ACCESS_CHANNEL);
}

const contentTypeOf = (path: string) => CONTENT_TYPES.find(([re]) => re.test(path))?.[1] ?? 'application/octet-stream';

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
