import { mkdir } from 'node:fs/promises';
import { join } from 'node:path';
import { and, eq } from 'drizzle-orm';
import { lessons, lessonVersions, recordings } from '~/db/schema';
import { chapterThumbnailPath, defaultCoverChapter } from '~/lib/publishing/cover';
import { libraryChanged } from '../services/library';
import type { VersionSnapshot } from '../services/publishing';
import { recordingPrefix } from '../services/recordings';
import { runFfmpeg } from '../media/ffmpeg-runner';
import { buildChapterThumbnailArgs } from '~/lib/media/chapter-thumbnail-args';
import type { JobHandler } from './job-context';
import { cleanScratch, ensureSource, uploadFolder } from './recording-files';

/** One small JPEG per chapter of a published version, taken a moment into the chapter. */
export const chapterThumbnails: JobHandler<'version.thumbnails'> = async ({ versionId }, ctx) => {
  const [row] = await ctx.deps.db
    .select({ version: lessonVersions, rec: recordings })
    .from(lessonVersions)
    .innerJoin(recordings, eq(recordings.id, lessonVersions.recordingId))
    .where(eq(lessonVersions.id, versionId));
  if (!row) return { outcome: 'skipped', detail: 'version is gone' };
  const { chapters } = row.version.snapshot as VersionSnapshot;
  const dir = join(ctx.workDir, `thumbs-${versionId}`);
  const out = join(dir, 'out');
  await mkdir(out, { recursive: true });
  const source = join(dir, 'source');
  await ensureSource(ctx.s3, ctx.bucket, row.rec.sourceKey, source, row.rec.sizeBytes, ctx.signal);
  for (const c of chapters) {
    await runFfmpeg(buildChapterThumbnailArgs({ input: source, output: join(out, `${c.index + 1}.jpg`), chapter: c, colorTransfer: row.rec.colorTransfer }), { signal: ctx.signal });
  }
  await uploadFolder(ctx.s3, ctx.bucket, out, `${recordingPrefix(row.rec)}media/chapters/${versionId}/`, ctx.signal);
  await cleanScratch(dir);
  // A class nobody chose a cover for shows its first work chapter, once that picture exists.
  const cover = defaultCoverChapter(chapters);
  if (cover !== null) {
    const set = await ctx.deps.db
      .update(lessons)
      .set({ coverPath: chapterThumbnailPath(versionId, cover) })
      .where(and(eq(lessons.id, row.version.lessonId), eq(lessons.publishedVersionId, versionId), eq(lessons.coverChosen, false)))
      .returning({ studioId: lessons.studioId });
    if (set[0]) await libraryChanged(ctx.deps, set[0].studioId);
  }
  return { outcome: 'done', detail: `${chapters.length} thumbnails` };
};
