import { randomUUID } from 'node:crypto';
import { and, eq } from 'drizzle-orm';
import { PutObjectCommand, type S3Client } from '@aws-sdk/client-s3';
import sharp from 'sharp';
import { lessons, lessonVersions, recordings } from '~/db/schema';
import type { CoverChoiceInput, CoverOutput } from '~/lib/api/cover-schemas';
import { chapterThumbnailPath, COVER_HEIGHT, COVER_WIDTH, coverUrl, defaultCoverChapter, uploadedCoverPath } from '~/lib/publishing/cover';
import { AppError, notFound } from '../errors';
import type { AppDeps } from '../app';
import { libraryChanged } from './library';
import type { VersionSnapshot } from './publishing';
import { recordingPrefix } from './recordings';

type Storage = { s3: S3Client; bucket: string };

async function coverFacts(deps: AppDeps, studioId: string, lessonId: string) {
  const [row] = await deps.db
    .select({ lesson: lessons, version: lessonVersions })
    .from(lessons)
    .leftJoin(lessonVersions, eq(lessonVersions.id, lessons.publishedVersionId))
    .where(and(eq(lessons.id, lessonId), eq(lessons.studioId, studioId)));
  if (!row) throw notFound('That class');
  // Chapter thumbnails live with the published version's recording; offered while that is the current one.
  const version = row.version && row.version.recordingId === row.lesson.currentRecordingId ? row.version : null;
  const chapters = version ? (version.snapshot as VersionSnapshot).chapters : [];
  return { lesson: row.lesson, version, chapters };
}

/** The class's cover and the chapter thumbnails it can choose from. */
export async function getCover(deps: AppDeps, studioId: string, lessonId: string): Promise<CoverOutput> {
  const { lesson, version, chapters } = await coverFacts(deps, studioId, lessonId);
  return {
    coverUrl: coverUrl(lesson.currentRecordingId, lesson.coverPath),
    chosen: lesson.coverChosen,
    chapters: version
      ? chapters.map((c) => ({
          number: c.index + 1,
          title: c.title,
          kind: c.kind,
          thumbnailUrl: coverUrl(lesson.currentRecordingId, chapterThumbnailPath(version.id, c.index))!,
        }))
      : [],
  };
}

async function setCover(deps: AppDeps, studioId: string, lessonId: string, coverPath: string | null, chosen: boolean): Promise<CoverOutput> {
  await deps.db.update(lessons).set({ coverPath, coverChosen: chosen, updatedAt: new Date() }).where(and(eq(lessons.id, lessonId), eq(lessons.studioId, studioId)));
  await libraryChanged(deps, studioId);
  return getCover(deps, studioId, lessonId);
}

/** Makes one chapter's thumbnail the cover, or goes back to the first work chapter's. */
export async function chooseCover(deps: AppDeps, studioId: string, lessonId: string, input: CoverChoiceInput): Promise<CoverOutput> {
  const { version, chapters } = await coverFacts(deps, studioId, lessonId);
  if (input.source === 'default') {
    const first = version ? defaultCoverChapter(chapters) : null;
    return setCover(deps, studioId, lessonId, version && first !== null ? chapterThumbnailPath(version.id, first) : null, false);
  }
  if (!version) {
    throw new AppError('conflict', 'Chapter pictures are made when the class is published. Publish it first, or upload a picture.');
  }
  const chapter = chapters[input.chapter - 1];
  if (!chapter) {
    throw new AppError('invalid_input', `This class has ${chapters.length} chapters; there is no chapter ${input.chapter}.`, { chapter: `Choose a chapter from 1 to ${chapters.length}.` });
  }
  return setCover(deps, studioId, lessonId, chapterThumbnailPath(version.id, chapter.index), true);
}

const notAPicture = () =>
  new AppError('unsupported_media', 'That file is not a JPEG or PNG picture we can read. Choose a .jpg or .png photo and try again.');

/**
 * Stores an uploaded picture as the cover: the bytes decide what it is (never the file name or
 * the declared type), only JPEG and PNG are taken, and it is cropped to fill 1280 × 720 and saved
 * as JPEG beside the recording's other pictures, under a new name so no cached copy of an older
 * cover is shown. Nothing is stored when any step refuses the file.
 */
export async function uploadCover(deps: AppDeps, storage: Storage, studioId: string, lessonId: string, bytes: Uint8Array): Promise<CoverOutput> {
  const { lesson } = await coverFacts(deps, studioId, lessonId);
  if (bytes.byteLength === 0) throw new AppError('invalid_input', 'The file is empty. Choose a .jpg or .png photo.');
  const [rec] = lesson.currentRecordingId
    ? await deps.db.select().from(recordings).where(and(eq(recordings.id, lesson.currentRecordingId), eq(recordings.state, 'ready')))
    : [];
  if (!rec) throw new AppError('conflict', 'A cover is kept with the class’s recording: upload a recording first, then its cover.');
  let jpeg: Buffer;
  try {
    const image = sharp(bytes, { failOn: 'error', limitInputPixels: 50_000_000 });
    const { format } = await image.metadata();
    if (format !== 'jpeg' && format !== 'png') throw notAPicture();
    jpeg = await image.rotate().resize(COVER_WIDTH, COVER_HEIGHT, { fit: 'cover', withoutEnlargement: false }).jpeg({ quality: 82, mozjpeg: true }).toBuffer();
  } catch (err) {
    if (err instanceof AppError) throw err;
    throw notAPicture(); // sharp could not decode it: a broken or disguised file
  }
  const path = uploadedCoverPath(randomUUID());
  await storage.s3.send(
    new PutObjectCommand({ Bucket: storage.bucket, Key: `${recordingPrefix(rec)}media/${path}`, Body: jpeg, ContentType: 'image/jpeg' }),
  );
  return setCover(deps, studioId, lessonId, path, true);
}
